// The screens. Loaders fill the request's QueryClient (on the server they read the services
// directly; in the browser they fetch), so a server-rendered screen arrives with its data.
import { data, redirect, type RouteObject } from 'react-router';
import { HOME_SCREEN } from '../domain/roles';
import { sessionQuery } from '../features/session/queries';
import { RouteError } from './route-error';
import { Root } from './root';
import { adminBeansRoute } from './admin-beans';
import { adminMenuRoute } from './admin-menu';
import { adminSettingsRoute } from './admin-settings';
import { adminTeamRoute } from './admin-team';
import { barRoute } from './bar';
import { dialInRoute } from './dial-in';
import { welcomeRoute } from './welcome';
import { counterRoute } from './counter';
import { outboxRoute } from './outbox';
import { labelsRoute } from './labels';
import { pickupRoute } from './pickup';
import { pulseRoute } from './pulse';
import { receiptRoute } from './receipt';
import { reportsRoute } from './reports';
import { signInRoute } from './signin';
import type { RouteDeps } from './deps';

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
        { id: 'signin', path: 'signin', ...signInRoute(deps) },
        { id: 'counter', path: 'counter', ...counterRoute(deps) },
        { id: 'bar', path: 'bar', ...barRoute(deps) },
        { id: 'pickup', path: 'pickup', ...pickupRoute(deps) },
        { id: 'pulse', path: 'pulse', ...pulseRoute(deps) },
        { id: 'receipt', path: 'receipts/:id', ...receiptRoute(deps) },
        { id: 'labels', path: 'labels/:id', ...labelsRoute(deps) },
        { id: 'outbox', path: 'outbox', ...outboxRoute(deps) },
        { id: 'reports', path: 'reports', ...reportsRoute(deps) },
        { id: 'dial-in', path: 'dial-in', ...dialInRoute(deps) },
        { id: 'admin-menu', path: 'admin/menu', ...adminMenuRoute(deps) },
        { id: 'admin-team', path: 'admin/team', ...adminTeamRoute(deps) },
        { id: 'admin-beans', path: 'admin/beans', ...adminBeansRoute(deps) },
        { id: 'admin-settings', path: 'admin/settings', ...adminSettingsRoute(deps) },
        { id: 'welcome', path: 'welcome/:token', ...welcomeRoute(deps) },
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
