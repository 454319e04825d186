// Set a password from an invitation or reset link (/welcome/:token). Open to everyone: the token
// is the proof. Being built: see the back-office issue.
import type { RouteDeps } from './deps';

function Welcome() {
  return (
    <main className="min-h-screen bg-steam-50 p-8 text-ink-900">
      <h1 className="text-3xl font-semibold">Set your password</h1>
    </main>
  );
}

export const welcomeRoute = (deps: RouteDeps) => {
  void deps;
  return { Component: Welcome, handle: { title: 'Set your password' } };
};
