// The screens' Api during server rendering: straight to the services, as the signed-in user.
import type { Api } from '@/lib/api';
import { pickupView } from '@/domain/pickup';
import type { SessionUser } from '@/domain/types';
import { HttpError } from '@server/errors';
import type { Deps } from '@server/deps';
import { outboxView } from '@server/mail/outbox';
import { beansServerApi } from './beans-api';
import { menuAdminServerApi } from './menu-admin-api';
import { reportsServerApi } from './reports-api';
import { settingsServerApi } from './settings-api';
import { teamServerApi } from './team-api';
import { loadMenu } from '@server/menu/menu';
import { findOrderInLocation, listOrders, loadOrder } from '@server/orders/order-views';
import { pulse } from '@server/shifts/pulse';
import { waitNowForCounter } from '@server/orders/quotes';
import { boardSnapshot } from '@server/tickets/tickets';

export function serverApi(deps: Deps, user: SessionUser | undefined): Api {
  const locationId = () => {
    if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in first');
    return user.locationId;
  };
  const signedIn = () => {
    locationId();
    return user!;
  };
  return {
    session: async () => ({ user: user ? { id: user.id, name: user.name, role: user.role } : null }),
    menu: () => loadMenu(deps.db, locationId()),
    tickets: () => boardSnapshot(deps, locationId()),
    pickup: async () => pickupView(await boardSnapshot(deps, locationId())),
    outbox: () => outboxView(deps.db, locationId(), signedIn().role),
    reports: reportsServerApi(deps, locationId),
    menuAdmin: menuAdminServerApi(deps, locationId),
    team: teamServerApi(deps, locationId, signedIn),
    settings: settingsServerApi(deps, locationId),
    beans: beansServerApi(deps, locationId),
    pulse: () => pulse(deps, locationId()),
    waitNow: async (drinks) => ({ waitNow: await waitNowForCounter(deps, locationId(), drinks) }),
    orders: async (q) => ({ orders: await listOrders(deps, signedIn(), q, 100) }),
    order: async (id) => {
      if (!(await findOrderInLocation(deps.db, signedIn(), id))) throw new HttpError(404, 'not_found', 'Order not found');
      return { order: await loadOrder(deps.db, id) };
    },
  };
}
