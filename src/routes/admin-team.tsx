// Team (back office). Being built: see the back-office issue.
import type { LoaderFunctionArgs } from 'react-router';
import { SCREENS } from '../domain/screens';
import { requireScreen, type RouteDeps } from './deps';

function AdminTeam() {
  return (
    <main className="min-h-screen bg-steam-50 p-8 text-ink-900">
      <h1 className="text-3xl font-semibold">Team</h1>
    </main>
  );
}

export const adminTeamRoute = (deps: RouteDeps) => ({
  Component: AdminTeam,
  handle: { title: 'Team' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminTeam.need);
    return null;
  },
});
