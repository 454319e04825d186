// Dial-in (back office). Being built: see the back-office issue.
import type { LoaderFunctionArgs } from 'react-router';
import { SCREENS } from '../domain/screens';
import { requireScreen, type RouteDeps } from './deps';

function DialIn() {
  return (
    <main className="min-h-screen bg-steam-50 p-8 text-ink-900">
      <h1 className="text-3xl font-semibold">Dial-in</h1>
    </main>
  );
}

export const dialInRoute = (deps: RouteDeps) => ({
  Component: DialIn,
  handle: { title: 'Dial-in' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.dialIn.need);
    return null;
  },
});
