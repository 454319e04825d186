// Every read the screens make, defined once: its path, who may make it, the input it takes and the
// shape of its answer. The GET routes and the server-rendering Api (server/reads.ts) and the
// browser's Api (src/lib/api.ts) are all made from this table, so their paths and checks can't
// drift apart. A `:name` in the path is filled from the input; the rest of the input is the query
// string. Commands (POST, PUT, …) are in src/commands.ts; CSV downloads are plain routes.
import type { z } from 'zod';
import type { BeansView, DialInView } from '@/domain/beans-schemas';
import type { CardCheckView } from '@/domain/card-check';
import type { DialInShotView } from '@/domain/dial-in';
import type { GroupReportView } from '@/domain/group-report';
import type { PlannedLane, ShotPlan } from '@/domain/lanes';
import type { AdminMenuView } from '@/domain/menu-admin-view';
import type { OutboxView } from '@/domain/outbox';
import type { PickupBoard } from '@/domain/pickup';
import type { PulseView } from '@/domain/pulse';
import type { ReportShiftsView, ReportView, TicketHistoryPage } from '@/domain/reports';
import type { ReportDaysView } from '@/domain/report-days';
import type { Capability } from '@/domain/roles';
import type { SettingsPage } from '@/domain/settings-schemas';
import type { SwitchPerson, TeamView, WelcomeView } from '@/domain/team-schemas';
import type { BoardSnapshot, MenuView, OrderView, SessionView } from '@/domain/types';
import type { CounterWaitNow } from '@/domain/wait-now';
import { cardCheckSchemas, schema, schemas, teamSchemas, waitNowSchemas } from '@/schemas-by-name';

export interface ReadDef {
  /** Under /api; `:name` segments come from the input. */
  path: string;
  /** null: open to everyone, signed in or not. */
  capability: Capability | null;
  /** The schema of the path's :params and the query string, checked as one object (a bad one
   * answers 400); `schema(module, name)` of src/schemas-by-name.ts. */
  input?: () => Promise<z.ZodType>;
  /** A screen's own background refresh: it doesn't keep an idle session awake (src/lib/http.ts). */
  passive?: true;
  /** Answered with `Cache-Control: no-store` (the path holds a secret). */
  noStore?: true;
}

declare const answer: unique symbol;
/** A definition carrying the type of its answer (a read's here, a command's in src/commands.ts). */
export type Answering<O> = { readonly [answer]?: [O] };
export type AnswerOf<R> = R extends Answering<infer O> ? O : never;
/** A read's definition, carrying the type of its answer. */
export type Read<O, D extends ReadDef = ReadDef> = D & Answering<O>;

/** `read<Answer>()({ path, capability, input? })`: the answer's type is given, the rest inferred. */
export const read =
  <O>() =>
  <const D extends ReadDef>(def: D): Read<O, D> =>
    def;

export const reads = {
  session: read<SessionView>()({ path: '/session', capability: null }),

  // the Counter, the Bar, Pickup and Pulse
  menu: read<MenuView>()({ path: '/menu', capability: 'viewQueue' }),
  /** `view: 'board'`: the open tickets and the ready ones still inside the Pickup timeout. */
  tickets: read<BoardSnapshot>()({ path: '/tickets', capability: 'viewQueue', input: schema(schemas, 'ticketsQuery') }),
  barLanes: read<{ seq: number; now: string; lanes: PlannedLane[]; shotPlan: ShotPlan }>()({ path: '/bar/lanes', capability: 'viewQueue' }),
  /** The Pickup screen's board: first names, numbers, status and ready times only. */
  pickup: read<PickupBoard>()({ path: '/pickup', capability: 'viewPickup' }),
  /** Today's orders, newest first; `q` matches a name or number. */
  orders: read<{ orders: OrderView[] }>()({ path: '/orders', capability: 'takeOrders', input: schema(schemas, 'ordersQuery') }),
  order: read<{ order: OrderView }>()({ path: '/orders/:id', capability: 'takeOrders', input: schema(schemas, 'idParam') }),
  /** The wait a customer would be quoted now for `drinks` bar drinks (the Counter, before payment).
   * Passive: a glance the Counter refreshes as the bar moves, not activity that keeps a session awake. */
  waitNow: read<{ waitNow: CounterWaitNow }>()({ path: '/wait-now', capability: 'takeOrders', input: schema(waitNowSchemas, 'waitNowQuery'), passive: true }),
  /** The shift lead's live numbers. */
  pulse: read<PulseView>()({ path: '/pulse', capability: 'viewPulse' }),
  /** Mail the local SMTP fake caught for this café, newest first. Passive: the Outbox refreshes
   * itself every few seconds, and that alone mustn't keep a session awake. */
  outbox: read<OutboxView>()({ path: '/outbox', capability: 'viewOutbox', passive: true }),

  // reports, for the lead and the owner
  /** Recent shifts, newest first, and the café's date today. */
  reportShifts: read<ReportShiftsView>()({ path: '/reports/shifts', capability: 'viewReports' }),
  reportShift: read<ReportView>()({ path: '/reports/shift/:id', capability: 'viewReports', input: schema(schemas, 'idParam') }),
  /** Café-local dates, both included. */
  reportRange: read<ReportView>()({ path: '/reports/range', capability: 'viewReports', input: schema(schemas, 'reportRangeQuery') }),
  /** The range's café-local dates day by day (a row each, zeros for a date without orders) and its total; at most a year. */
  reportDays: read<ReportDaysView>()({ path: '/reports/days', capability: 'viewReports', input: schema(schemas, 'reportDaysQuery') }),
  /** Every café of the owner's group side by side over the same café-local dates; the owner's
   * alone (switchCafe: the capability that spans the group's cafés). */
  reportGroup: read<GroupReportView>()({ path: '/reports/group', capability: 'switchCafe', input: schema(schemas, 'reportRangeQuery') }),
  reportTickets: read<TicketHistoryPage>()({ path: '/reports/tickets', capability: 'viewReports', input: schema(schemas, 'ticketHistoryQuery') }),
  /** The card check of a café-local date (today when left out). */
  cardCheck: read<CardCheckView>()({ path: '/reports/cards', capability: 'viewReports', input: schema(cardCheckSchemas, 'cardCheckQuery') }),

  // back office
  /** The whole menu as the owner edits it, retired things included. */
  menuAdmin: read<AdminMenuView>()({ path: '/menu-admin', capability: 'editMenu' }),
  team: read<TeamView>()({ path: '/team', capability: 'manageTeam' }),
  /** Who may take over this terminal by PIN. */
  switchPeople: read<{ people: SwitchPerson[] }>()({ path: '/switch/people', capability: 'viewQueue' }),
  /** Who an invitation or reset link is for; 404 when it can't be used. */
  welcome: read<WelcomeView>()({ path: '/welcome/:token', capability: null, input: schema(teamSchemas, 'tokenParam'), noStore: true }),
  settings: read<SettingsPage>()({ path: '/settings', capability: 'editSettings' }),
  /** Every lot, retired ones last, and the location's dial-in window (owner). */
  beans: read<BeansView>()({ path: '/beans', capability: 'manageBeans' }),
  /** Lots in use, the window and the lot in the espresso grinder (barista and up). */
  dialIn: read<DialInView>()({ path: '/dial-in', capability: 'logDialIn' }),
  /** A lot's latest test shots, newest first. */
  lotShots: read<{ shots: DialInShotView[] }>()({ path: '/dial-in/lots/:id/shots', capability: 'logDialIn', input: schema(schemas, 'idParam') }),
};

export type Reads = typeof reads;

/** Each read as a function: `api.orders({ q })`, `api.reportShift({ id })`, `api.menu()`. */
export type Api = { [K in keyof Reads]: ReadCall<Reads[K]> };

/**
 * The header of a request a screen makes in the background (a passive read, the live socket's
 * session check): it does not count as the person being active (server/auth/session.ts).
 */
export const PASSIVE_REQUEST_HEADER = 'x-jugline-passive';
export type ReadName = keyof Reads;
export const READ_NAMES = Object.keys(reads) as ReadName[];

type SchemaOf<R> = R extends { input: () => Promise<infer S extends z.ZodType> } ? S : undefined;
/** The schema's input, with a coerced field (typed `unknown` by zod) as the type it becomes. */
export type CallerInput<S extends z.ZodType> = {
  [K in keyof z.input<S>]: unknown extends z.input<S>[K] ? (K extends keyof z.output<S> ? z.output<S>[K] : never) : z.input<S>[K];
};

/** What a caller passes to a read. */
export type ReadInput<R> = SchemaOf<R> extends z.ZodType ? CallerInput<SchemaOf<R>> : void;
/** What the server's handler gets: the input as parsed, defaults filled in. */
export type ParsedInput<R> = SchemaOf<R> extends z.ZodType ? z.output<SchemaOf<R>> : void;
export type ReadOutput<R> = AnswerOf<R>;

/** A read as a function: no argument without an input, an optional one when every field may be left out. */
export type ReadCall<R> =
  SchemaOf<R> extends z.ZodType
    ? object extends ReadInput<R>
      ? (input?: ReadInput<R>) => Promise<ReadOutput<R>>
      : (input: ReadInput<R>) => Promise<ReadOutput<R>>
    : () => Promise<ReadOutput<R>>;

/**
 * What goes over the wire: the path with its :params filled, and the rest of the input as query
 * values. Empty values (undefined, null, '') are left out, as a form leaves out an empty field.
 * The server parses `{ ...query, ...params }` the same way whether it came over HTTP or not.
 */
export function wireOf(def: ReadDef, input: object | void): { path: string; params: Record<string, string>; query: Record<string, string> } {
  const values: Record<string, string> = {};
  for (const [k, v] of Object.entries(input ?? {})) if (v !== undefined && v !== null && v !== '') values[k] = String(v);
  const params: Record<string, string> = {};
  const path = fillPath(def.path, values, (name, value) => (params[name] = value === undefined ? '' : String(value)));
  return { path, params, query: values };
}

/**
 * A read's or a command's path with each `:name` filled, URL-encoded, from `values`; a name used
 * in the path is taken out of `values` (the rest is the query string, or the body).
 */
export function fillPath<V>(
  path: string,
  values: Record<string, V>,
  asText: (name: string, value: V | undefined) => string = (_, v) => String(v ?? ''),
): string {
  return path.replace(/:(\w+)/g, (_, name: string) => {
    const text = asText(name, values[name]);
    delete values[name];
    return encodeURIComponent(text);
  });
}
