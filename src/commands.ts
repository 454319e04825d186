// Every command the screens send (each JSON POST, PUT, PATCH and DELETE), defined once: its method
// and path, who may send it, the schemas of its :params and body, the shape of its answer and its
// status. The routes (server/commands.ts, with one handler per command in its area's folder) and
// the browser's sender (src/lib/commands.ts) are both made from this table, so their paths,
// methods and bodies can't drift apart. The caller passes one object: the path's `:name` values
// come from it, the rest of it is the body. What stays a plain route (sign-in and sign-out, file
// uploads, the payment webhook) is listed in tests/api/commands.test.ts.
import type { z } from 'zod';
import type { BeanLotView, BeanSettingsView } from '@/domain/bean-stock';
import type { LoggedShot } from '@/domain/beans-schemas';
import type { CardCheckView } from '@/domain/card-check';
import type { MenuAdminResult } from '@/domain/menu-admin-view';
import type { SettingsPage } from '@/domain/settings-schemas';
import type { LinkPurpose, TeamMember } from '@/domain/team-schemas';
import type { CafeRef, OrderView, PublicUser, ShiftView, TicketView } from '@/domain/types';
import { fillPath, type AnswerOf, type Answering, type CallerInput, type ReadDef } from '@/reads';
import { beansSchemas, cardCheckSchemas, menuAdminSchemas, schema, schemas, settingsSchemas, teamSchemas } from '@/schemas-by-name';

/** `capability` (null: open to everyone) and `passive` (sent in the background, so it doesn't keep an
 * idle session awake) as a read's. */
export interface CommandDef extends Pick<ReadDef, 'capability' | 'passive'> {
  method: 'post' | 'put' | 'patch' | 'delete';
  /** Under /api; `:name` segments come from the input and are checked by `params`. */
  path: string;
  /** The schema of the path's :params (a bad one answers 400 naming `params.<name>`). */
  params?: () => Promise<z.ZodType>;
  /** The schema of the JSON body; without one, nothing is sent and nothing read. */
  body?: () => Promise<z.ZodType>;
  /** The status of a success: 200 unless given (201 for a create, 202 when handed on, 204 with no answer). */
  status?: 201 | 202 | 204;
}

/** A command's definition, carrying the type of its answer. */
export type Command<O, D extends CommandDef = CommandDef> = D & Answering<O>;

/** `command<Answer>()({ method, path, capability, params?, body? })`: the answer's type is given, the rest inferred. */
export const command =
  <O>() =>
  <const D extends CommandDef>(def: D): Command<O, D> =>
    def;

const id = schema(schemas, 'idParam');
const retired = schema(menuAdminSchemas, 'retiredBody');
const move = schema(menuAdminSchemas, 'moveBody');
const menuChange = command<MenuAdminResult>();
/** The four commands of each kind the menu editor edits: created, updated (the whole row), retired
 * or restored (`{ retired }`), moved (`{ direction }`); each answers the id it made or changed and
 * the whole editable menu. */
const menuKind = <const K extends string, const B extends 'categoryBody' | 'itemBody' | 'milkBody' | 'extraGroupBody' | 'extraBody'>(kind: K, body: B) => {
  const path = `/menu-admin/${kind}` as const;
  const base = { capability: 'editMenu', params: id } as const;
  return {
    create: menuChange({ method: 'post', path, capability: 'editMenu', body: schema(menuAdminSchemas, body), status: 201 }),
    update: menuChange({ ...base, method: 'put', path: `${path}/:id`, body: schema(menuAdminSchemas, body) }),
    retired: menuChange({ ...base, method: 'post', path: `${path}/:id/retired`, body: retired }),
    move: menuChange({ ...base, method: 'post', path: `${path}/:id/move`, body: move }),
  };
};
const categories = menuKind('categories', 'categoryBody');
const items = menuKind('items', 'itemBody');
const milks = menuKind('milks', 'milkBody');
const extraGroups = menuKind('extra-groups', 'extraGroupBody');
const extras = menuKind('extras', 'extraBody');
const ticket = command<{ ticket: TicketView }>();
const tickets = command<{ tickets: TicketView[] }>();

export const commands = {
  // a shared terminal and one's own PIN (sign-in and sign-out are plain routes: server/auth/routes.ts)
  /** Another person of the same café takes over this terminal by PIN; a new session id. */
  switchPerson: command<{ user: PublicUser }>()({ method: 'post', path: '/session/switch', capability: 'viewQueue', body: schema(teamSchemas, 'switchBody') }),
  /** An owner works on another café of their group from now on in this session; the screens reload. */
  chooseCafe: command<{ cafe: CafeRef }>()({ method: 'post', path: '/session/cafe', capability: 'switchCafe', body: schema(teamSchemas, 'chooseCafeBody') }),
  setOwnPin: command<void>()({ method: 'put', path: '/me/pin', capability: 'viewQueue', body: schema(teamSchemas, 'ownPinBody'), status: 204 }),

  // the Counter
  /** 201 for a new order, 200 for one the server already has under the same clientOrderId. */
  placeOrder: command<{ order: OrderView }>()({
    method: 'post',
    path: '/orders',
    capability: 'takeOrders',
    body: schema(schemas, 'createOrderBody'),
    status: 201,
  }),
  refundOrder: command<{ order: OrderView }>()({
    method: 'post',
    path: '/orders/:id/refund',
    capability: 'refundOrders',
    params: id,
    body: schema(schemas, 'refundBody'),
  }),
  voidOrder: command<{ order: OrderView }>()({
    method: 'post',
    path: '/orders/:id/void',
    capability: 'refundOrders',
    params: id,
    body: schema(schemas, 'voidBody'),
  }),
  /** One drink's own money back (:id is the drink, an order line); who may refund may refund a drink. */
  refundDrink: command<{ order: OrderView }>()({
    method: 'post',
    path: '/drinks/:id/refund',
    capability: 'refundOrders',
    params: id,
    body: schema(schemas, 'drinkRefundBody'),
  }),
  /** 201: a new drink on the same ticket, at no charge, back on the Bar. */
  remakeDrink: command<{ order: OrderView }>()({
    method: 'post',
    path: '/drinks/:id/remake',
    capability: 'remakeDrinks',
    params: id,
    body: schema(schemas, 'remakeBody'),
    status: 201,
  }),
  /** 202: handed to the mail server. Mounted only when the server has one. */
  mailReceipt: command<{ sent: true; messageId: string }>()({
    method: 'post',
    path: '/orders/:id/receipt',
    capability: 'takeOrders',
    params: id,
    body: schema(schemas, 'receiptEmailBody'),
    status: 202,
  }),
  collectTicket: ticket({ method: 'post', path: '/tickets/:id/collect', capability: 'collectTickets', params: id }),
  rushTicket: ticket({ method: 'post', path: '/tickets/:id/rush', capability: 'rushTickets', params: id }),
  /** 86 and back on: the Counter's, open to leads too (and used by the menu editor). */
  setAvailability: command<{ item: { id: number; available: boolean } }>()({
    method: 'post',
    path: '/menu/items/:id/availability',
    capability: 'eightySix',
    params: id,
    body: schema(schemas, 'availabilityBody'),
  }),

  // the Bar
  startDrinks: tickets({ method: 'post', path: '/drinks/start', capability: 'makeDrinks', body: schema(schemas, 'drinkBatchBody') }),
  bumpDrinks: tickets({ method: 'post', path: '/drinks/bump', capability: 'makeDrinks', body: schema(schemas, 'drinkBatchBody') }),
  /** The drinks the screen shows in the jug: they become that jug for good. */
  startJug: command<{ jugId: number; tickets: TicketView[] }>()({
    method: 'post',
    path: '/jugs',
    capability: 'makeDrinks',
    body: schema(schemas, 'drinkBatchBody'),
    status: 201,
  }),
  /** A started jug and the drinks the screen shows in it: refused (409) if they changed meanwhile. */
  bumpJug: tickets({ method: 'post', path: '/jugs/:id/bump', capability: 'makeDrinks', params: id, body: schema(schemas, 'drinkBatchBody') }),
  startDrink: ticket({ method: 'post', path: '/drinks/:id/start', capability: 'makeDrinks', params: id }),
  acknowledgeAllergy: ticket({ method: 'post', path: '/drinks/:id/acknowledge-allergy', capability: 'makeDrinks', params: id }),
  bumpDrink: ticket({ method: 'post', path: '/drinks/:id/bump', capability: 'makeDrinks', params: id }),
  bumpTicket: ticket({ method: 'post', path: '/tickets/:id/bump', capability: 'makeDrinks', params: id }),
  recallTicket: ticket({ method: 'post', path: '/tickets/:id/recall', capability: 'makeDrinks', params: id }),

  // shifts and the day's card check (Pulse, reports)
  openShift: command<{ shift: ShiftView }>()({ method: 'post', path: '/shifts', capability: 'runShifts', body: schema(schemas, 'openShiftBody'), status: 201 }),
  setBaristas: command<{ shift: ShiftView }>()({
    method: 'post',
    path: '/shifts/current/baristas',
    capability: 'runShifts',
    body: schema(schemas, 'baristasBody'),
  }),
  /** `mailed`: the owner was sent the shift report. */
  closeShift: command<{ shift: ShiftView; mailed: boolean }>()({
    method: 'post',
    path: '/shifts/current/close',
    capability: 'runShifts',
    body: schema(schemas, 'closeShiftBody'),
  }),
  settleCards: command<CardCheckView>()({
    method: 'post',
    path: '/reports/cards/settle',
    capability: 'refundOrders',
    body: schema(cardCheckSchemas, 'cardSettleBody'),
  }),

  // the menu editor (see menuKind)
  createCategory: categories.create,
  updateCategory: categories.update,
  setCategoryRetired: categories.retired,
  moveCategory: categories.move,
  createItem: items.create,
  updateItem: items.update,
  setItemRetired: items.retired,
  moveItem: items.move,
  createMilk: milks.create,
  updateMilk: milks.update,
  setMilkRetired: milks.retired,
  moveMilk: milks.move,
  createExtraGroup: extraGroups.create,
  updateExtraGroup: extraGroups.update,
  setExtraGroupRetired: extraGroups.retired,
  moveExtraGroup: extraGroups.move,
  createExtra: extras.create,
  updateExtra: extras.update,
  setExtraRetired: extras.retired,
  moveExtra: extras.move,
  /** A size is retired or restored with its item's form; it has no commands of its own besides. */
  setSizeRetired: menuChange({ method: 'post', path: '/menu-admin/sizes/:id/retired', capability: 'editMenu', params: id, body: retired }),
  /** The item's photo goes (uploading one is a multipart route: server/menu/import-routes.ts). */
  removeItemPhoto: command<{ item: { id: number; photoUrl: string | null } }>()({
    method: 'delete',
    path: '/menu/items/:id/photo',
    capability: 'editMenu',
    params: id,
  }),

  // the team; the welcome link sets a password and signs its person in
  /** `mailed`: the invitation went to the mail server. */
  addPerson: command<{ member: TeamMember; mailed: boolean }>()({
    method: 'post',
    path: '/team',
    capability: 'manageTeam',
    body: schema(teamSchemas, 'newPersonBody'),
    status: 201,
  }),
  updatePerson: command<{ member: TeamMember }>()({
    method: 'patch',
    path: '/team/:id',
    capability: 'manageTeam',
    params: id,
    body: schema(teamSchemas, 'personPatchBody'),
  }),
  sendLink: command<{ purpose: LinkPurpose; to: string }>()({
    method: 'post',
    path: '/team/:id/link',
    capability: 'manageTeam',
    params: id,
    body: schema(teamSchemas, 'sendLinkBody'),
    status: 202,
  }),
  /** `pin: null` clears it. */
  setPin: command<void>()({ method: 'put', path: '/team/:id/pin', capability: 'manageTeam', params: id, body: schema(teamSchemas, 'pinBody'), status: 204 }),
  acceptLink: command<{ user: PublicUser }>()({
    method: 'post',
    path: '/welcome/:token',
    capability: null,
    params: schema(teamSchemas, 'tokenParam'),
    body: schema(teamSchemas, 'setPasswordBody'),
  }),

  // settings: each answers the whole page again
  updateSettings: command<SettingsPage>()({ method: 'put', path: '/settings', capability: 'editSettings', body: schema(settingsSchemas, 'settingsBody') }),
  addPitcher: command<SettingsPage>()({
    method: 'post',
    path: '/settings/pitchers',
    capability: 'editSettings',
    body: schema(settingsSchemas, 'pitcherBody'),
    status: 201,
  }),
  updatePitcher: command<SettingsPage>()({
    method: 'put',
    path: '/settings/pitchers/:id',
    capability: 'editSettings',
    params: id,
    body: schema(settingsSchemas, 'pitcherBody'),
  }),
  removePitcher: command<SettingsPage>()({ method: 'delete', path: '/settings/pitchers/:id', capability: 'editSettings', params: id }),

  // bean lots (the owner) and the dial-in log (barista and up)
  createLot: command<{ lot: BeanLotView }>()({
    method: 'post',
    path: '/beans/lots',
    capability: 'manageBeans',
    body: schema(beansSchemas, 'beanLotBody'),
    status: 201,
  }),
  updateLot: command<{ lot: BeanLotView }>()({
    method: 'put',
    path: '/beans/lots/:id',
    capability: 'manageBeans',
    params: id,
    body: schema(beansSchemas, 'beanLotBody'),
  }),
  retireLot: command<{ lot: BeanLotView }>()({ method: 'post', path: '/beans/lots/:id/retire', capability: 'manageBeans', params: id }),
  saveBeanSettings: command<{ settings: BeanSettingsView }>()({
    method: 'put',
    path: '/beans/settings',
    capability: 'manageBeans',
    body: schema(beansSchemas, 'beanSettingsBody'),
  }),
  logShot: command<LoggedShot>()({
    method: 'post',
    path: '/dial-in/shots',
    capability: 'logDialIn',
    body: schema(beansSchemas, 'dialInShotBody'),
    status: 201,
  }),
};

export type Commands = typeof commands;
export type CommandName = keyof Commands;
export const COMMAND_NAMES = Object.keys(commands) as CommandName[];

type ParamsSchemaOf<C> = C extends { params: () => Promise<infer S extends z.ZodType> } ? S : undefined;
type BodySchemaOf<C> = C extends { body: () => Promise<infer S extends z.ZodType> } ? S : undefined;

/** The path's values as the caller gives them (`{ id: 12 }`). */
type ParamsInput<C> = ParamsSchemaOf<C> extends z.ZodType ? CallerInput<ParamsSchemaOf<C>> : unknown;
/** The body as the caller sends it. */
export type CommandBody<C> = BodySchemaOf<C> extends z.ZodType ? z.input<BodySchemaOf<C>> : unknown;
/** What a caller passes: the path's values and the body's fields in one object. */
export type CommandInput<C> = ParamsInput<C> & CommandBody<C>;
/** What the server's handler gets: the params and the body as parsed. */
export type ParsedParams<C> = ParamsSchemaOf<C> extends z.ZodType ? z.output<ParamsSchemaOf<C>> : undefined;
export type ParsedBody<C> = BodySchemaOf<C> extends z.ZodType ? z.output<BodySchemaOf<C>> : undefined;
export type CommandOutput<C> = AnswerOf<C>;

/** Each command as a function: `send.refundOrder({ id, reason })`, `send.retireLot({ id })`. */
export type CommandSender = { [K in CommandName]: (input: CommandInput<Commands[K]>) => Promise<CommandOutput<Commands[K]>> };

/**
 * What goes over the wire: the path with its :params filled from the input, and the rest of the
 * input as the body (none when the command takes no body).
 */
export function wireOfCommand(def: CommandDef, input: object): { path: string; body: object | undefined } {
  const rest: Record<string, unknown> = { ...input };
  const path = fillPath(def.path, rest);
  return { path, body: def.body ? rest : undefined };
}
