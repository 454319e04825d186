// The screens. Loaders fill the request's QueryClient (on the server they read the services
// directly; in the browser they fetch), so a server-rendered screen arrives with its data.
// Each screen is its own chunk (`lazy`): a Bar tablet never downloads the Counter's forms or the
// Reports' tables. The server resolves the matched screens before rendering (the static handler
// does it), and the browser does the same before hydrating (`resolveLazyMatches`), so the first
// paint is the server's HTML and hydration finds the same tree.
import { data, matchRoutes, redirect, type RouteObject } from 'react-router';
import { HOME_SCREEN } from '@/domain/roles';
import { sessionQuery } from '@/queries/session';
import { RouteError } from './route-error';
import { Root } from './root';
import type { RouteDeps } from './deps';

/**
 * The source file of each lazy screen, as the build manifest names it: the server adds
 * `<link rel="modulepreload">` for the matched screen's chunks, so the browser fetches them beside
 * the entry instead of after it. tests/unit/lazy-routes.test.ts keeps this table and the imports
 * below in step.
 */
export const SCREEN_FILES: Readonly<Record<string, string>> = {
  signin: 'src/routes/signin.tsx',
  counter: 'src/routes/counter.tsx',
  bar: 'src/routes/bar.tsx',
  pickup: 'src/routes/pickup.tsx',
  pulse: 'src/routes/pulse.tsx',
  receipt: 'src/routes/receipt.tsx',
  labels: 'src/routes/labels.tsx',
  outbox: 'src/routes/outbox.tsx',
  reports: 'src/routes/reports.tsx',
  'card-check': 'src/routes/card-check.tsx',
  'dial-in': 'src/routes/dial-in.tsx',
  'admin-menu': 'src/routes/admin-menu.tsx',
  'admin-team': 'src/routes/admin-team.tsx',
  'admin-beans': 'src/routes/admin-beans.tsx',
  'admin-settings': 'src/routes/admin-settings.tsx',
  welcome: 'src/routes/welcome.tsx',
};

export function createRoutes(deps: RouteDeps): RouteObject[] {
  return [
    {
      id: 'root',
      path: '/',
      Component: Root,
      ErrorBoundary: RouteError,
      loader: async () => {
        await deps.queryClient.ensureQueryData(sessionQuery(deps.api));
        return null;
      },
      children: [
        {
          id: 'home',
          index: true,
          loader: async () => {
            const { user } = await deps.queryClient.ensureQueryData(sessionQuery(deps.api));
            throw redirect(user ? HOME_SCREEN[user.role] : '/signin');
          },
        },
        // import() paths must be literal for the bundler to split them.
        { id: 'signin', path: 'signin', lazy: async () => (await import('./signin')).signInRoute(deps) },
        { id: 'counter', path: 'counter', lazy: async () => (await import('./counter')).counterRoute(deps) },
        { id: 'bar', path: 'bar', lazy: async () => (await import('./bar')).barRoute(deps) },
        { id: 'pickup', path: 'pickup', lazy: async () => (await import('./pickup')).pickupRoute(deps) },
        { id: 'pulse', path: 'pulse', lazy: async () => (await import('./pulse')).pulseRoute(deps) },
        { id: 'receipt', path: 'receipts/:id', lazy: async () => (await import('./receipt')).receiptRoute(deps) },
        { id: 'labels', path: 'labels/:id', lazy: async () => (await import('./labels')).labelsRoute(deps) },
        { id: 'outbox', path: 'outbox', lazy: async () => (await import('./outbox')).outboxRoute(deps) },
        { id: 'reports', path: 'reports', lazy: async () => (await import('./reports')).reportsRoute(deps) },
        { id: 'card-check', path: 'reports/cards', lazy: async () => (await import('./card-check')).cardCheckRoute(deps) },
        { id: 'dial-in', path: 'dial-in', lazy: async () => (await import('./dial-in')).dialInRoute(deps) },
        { id: 'admin-menu', path: 'admin/menu', lazy: async () => (await import('./admin-menu')).adminMenuRoute(deps) },
        { id: 'admin-team', path: 'admin/team', lazy: async () => (await import('./admin-team')).adminTeamRoute(deps) },
        { id: 'admin-beans', path: 'admin/beans', lazy: async () => (await import('./admin-beans')).adminBeansRoute(deps) },
        { id: 'admin-settings', path: 'admin/settings', lazy: async () => (await import('./admin-settings')).adminSettingsRoute(deps) },
        { id: 'welcome', path: 'welcome/:token', lazy: async () => (await import('./welcome')).welcomeRoute(deps) },
        {
          id: 'not-found',
          path: '*',
          handle: { title: 'Not found' },
          loader: () => {
            throw data({ message: 'There is no screen here.' }, { status: 404, statusText: 'Not Found' });
          },
        },
      ],
    },
  ];
}

/**
 * Loads the lazy screens that match `location` and writes them into their route objects, before
 * the browser router is made from them. Without this the router would start uninitialised and
 * render nothing (or a fallback) where the server's HTML is, and hydration would not match.
 * Answers the ids it resolved.
 */
export async function resolveLazyMatches(routes: RouteObject[], location: string | { pathname: string }): Promise<string[]> {
  const matches = matchRoutes(routes, location) ?? [];
  const lazy = matches.map((m) => m.route).filter((r) => typeof r.lazy === 'function');
  await Promise.all(
    lazy.map(async (route) => {
      const loaded = await (route.lazy as () => Promise<Partial<RouteObject>>)();
      Object.assign(route, loaded, { lazy: undefined });
    }),
  );
  return lazy.map((r) => r.id ?? '');
}
