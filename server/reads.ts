// The server's side of every read in src/reads.ts: one handler each, straight to the services.
// From them come the GET routes (readRoutes) and the Api that server rendering reads through
// (serverApi); both check the read's capability and parse its input the same way, so a page
// rendered on the server is refused and validated exactly as the browser's request would be.
import { openTickets } from '@/domain/tickets';
import { planBar } from '@/domain/lanes';
import { pickupView } from '@/domain/pickup';
import type { SessionUser } from '@/domain/types';
import type { Api } from '@/reads';
import { READ_NAMES, reads, wireOf, type ParsedInput, type ReadDef, type ReadOutput, type Reads } from '@/reads';
import { refusal } from './auth/guards';
import { sessionView } from './auth/cafe-in-view';
import { beansView } from './beans/beans';
import { dialInView, lotShots } from './beans/dial-in';
import type { Deps } from './deps';
import { asHttpError, notFound, parse } from './errors';
import { outboxView } from './mail/outbox';
import { loadAdminMenu } from './menu/admin';
import { currentMenu } from './menu/menu-cache';
import { findOrderInLocation, listOrders, loadOrder } from './orders/order-views';
import { waitNowForCounter } from './orders/quotes';
import { cardCheck } from './payments/card-check';
import { groupReport, rangeReport, reportDays, reportShifts, shiftReport, ticketHistory } from './reports';
import type { ApiRoute } from './routes';
import { loadSettings } from './settings/settings';
import { pulse } from './shifts/pulse';
import { welcomeView } from './team/invitations';
import { switchPeople } from './team/pins';
import { listTeam } from './team/team';
import { boardSnapshot } from './tickets/tickets';

/** Who is asking: a read open to everyone may be made signed out; any other only signed in. */
export interface ReadContext<R> {
  deps: Deps;
  user: R extends { capability: null } ? SessionUser | undefined : SessionUser;
}
export type ReadHandler<R> = (ctx: ReadContext<R>, input: ParsedInput<R>) => Promise<ReadOutput<R>>;

/** One handler per read; a missing one, or one answering the wrong shape, fails the typecheck. */
export const readHandlers: { [K in keyof Reads]: ReadHandler<Reads[K]> } = {
  session: ({ deps, user }) => sessionView(deps.db, user),

  menu: ({ deps, user }) => currentMenu(deps.db, user.locationId),
  tickets: async ({ deps, user }, { view }) => {
    const board = await boardSnapshot(deps, user.locationId);
    return view === 'open' ? { ...board, tickets: board.tickets.filter((t) => openTickets(t, 0)) } : board;
  },
  barLanes: async ({ deps, user }) => {
    const board = await boardSnapshot(deps, user.locationId);
    const open = board.tickets.filter((t) => openTickets(t, 0));
    return { seq: board.seq, now: board.now, ...planBar(open, board.location.jugRules) };
  },
  pickup: async ({ deps, user }) => pickupView(await boardSnapshot(deps, user.locationId)),
  orders: async ({ deps, user }, { q, limit }) => ({ orders: await listOrders(deps, user, q, limit) }),
  order: async ({ deps, user }, { id }) => {
    if (!(await findOrderInLocation(deps.db, user, id))) throw notFound('Order');
    return { order: await loadOrder(deps.db, id) };
  },
  waitNow: async ({ deps, user }, { drinks }) => ({ waitNow: await waitNowForCounter(deps, user.locationId, drinks) }),
  pulse: ({ deps, user }) => pulse(deps, user.locationId),
  outbox: ({ deps, user }) => outboxView(deps.db, user.locationId, user.role),

  reportShifts: ({ deps, user }) => reportShifts(deps.db, user.locationId, deps.clock()),
  reportShift: ({ deps, user }, { id }) => shiftReport(deps.db, user.locationId, id, deps.clock()),
  reportRange: ({ deps, user }, { from, to }) => rangeReport(deps.db, user.locationId, from, to, deps.clock()),
  reportDays: ({ deps, user }, { from, to }) => reportDays(deps.db, user.locationId, from, to, deps.clock()),
  reportGroup: ({ deps, user }, { from, to }) => groupReport(deps.db, user.locationId, from, to, deps.clock()),
  reportTickets: ({ deps, user }, query) => ticketHistory(deps.db, user.locationId, query),
  cardCheck: ({ deps, user }, { date }) => cardCheck(deps, user.locationId, date),

  menuAdmin: ({ deps, user }) => loadAdminMenu(deps.db, user.locationId),
  team: ({ deps, user }) => listTeam(deps, user),
  switchPeople: async ({ deps, user }) => ({ people: await switchPeople(deps.db, user) }),
  welcome: ({ deps }, { token }) => welcomeView(deps, token),
  settings: ({ deps, user }) => loadSettings(deps.db, user.locationId),
  beans: ({ deps, user }) => beansView(deps, user.locationId),
  dialIn: ({ deps, user }) => dialInView(deps, user.locationId),
  lotShots: async ({ deps, user }, { id }) => ({ shots: await lotShots(deps.db, user.locationId, id) }),
};

type AnyHandler = (ctx: { deps: Deps; user: SessionUser | undefined }, input: unknown) => Promise<unknown>;
const handlerOf = (name: keyof Reads) => readHandlers[name] as AnyHandler;

/** The read's input from its :params and query values; a bad one is a 400 naming the fields. */
async function inputOf(def: ReadDef, values: { params: object; query: object }): Promise<unknown> {
  if (!def.input) return undefined;
  // the path's own values win over a query key of the same name
  return parse(await def.input(), { ...values.query, ...values.params }, def.path.includes(':') ? 'params' : 'query');
}

/** The GET route of every read; mountRoutes puts the capability's guard before each. */
export function readRoutes(deps: Deps): ApiRoute[] {
  return READ_NAMES.map((name): ApiRoute => {
    const def: ReadDef = reads[name];
    const handler = handlerOf(name);
    return {
      method: 'get',
      path: def.path,
      capability: def.capability,
      handler: async (req, res) => {
        const input = await inputOf(def, { params: req.params, query: req.query });
        if (def.noStore) res.set('Cache-Control', 'no-store');
        res.json(await handler({ deps, user: req.user }, input));
      },
    };
  });
}
/**
 * The screens' Api during server rendering: each read as `user` would make it over HTTP — the
 * same capability check (401 signed out, 403 without it), the same input check, the same
 * handler, a refusal with the same status — without the network round trip.
 */
export function serverApi(deps: Deps, user: SessionUser | undefined): Api {
  const api: Record<string, (input?: object) => Promise<unknown>> = {};
  for (const name of READ_NAMES) {
    const def: ReadDef = reads[name];
    const handler = handlerOf(name);
    api[name] = async (input) => {
      const refused = refusal(user, def.capability);
      if (refused) throw refused;
      try {
        return await handler({ deps, user }, await inputOf(def, wireOf(def, input)));
      } catch (err) {
        throw asHttpError(err);
      }
    };
  }
  return api as unknown as Api;
}
