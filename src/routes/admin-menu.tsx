// Menu (back office). Being built: see the back-office issue.
import type { LoaderFunctionArgs } from 'react-router';
import { SCREENS } from '../domain/screens';
import { requireScreen, type RouteDeps } from './deps';

function AdminMenu() {
  return (
    <main className="min-h-screen bg-steam-50 p-8 text-ink-900">
      <h1 className="text-3xl font-semibold">Menu</h1>
    </main>
  );
}

export const adminMenuRoute = (deps: RouteDeps) => ({
  Component: AdminMenu,
  handle: { title: 'Menu' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminMenu.need);
    return null;
  },
});
