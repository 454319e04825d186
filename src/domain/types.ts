// Shapes the API answers with and the screens render. Shared by client and server.
import type { BarEffect } from './drink-options';
import type { Jug, JugRules, SteamedTexture } from './jug-plan';
import type { RemakeMark } from './remakes';
import type { Role } from './roles';
import type { PaidPart } from './split-payment';
import type { TipSettings } from './tips';
import type { TemperatureUnit, VolumeUnit } from './units';

export type Station = 'bar' | 'counter';
/** Milk texture a drink is steamed for, thinnest first. Our own names. */
export const TEXTURES = ['flat', 'silky', 'foamy', 'cold'] as const;
export type Texture = (typeof TEXTURES)[number];
export type DrinkStatus = 'queued' | 'making' | 'done';
export type TicketStatus = 'pending' | 'open' | 'ready' | 'collected' | 'void';
export type PaymentStatus = 'unpaid' | 'paid' | 'refunded';
export type Service = 'takeaway' | 'dine_in';

export interface SessionUser {
  id: number;
  name: string;
  role: Role;
  locationId: number;
}

/** A café by name, as the group's list shows it. */
export interface CafeRef {
  id: number;
  name: string;
}

/** GET /api/session: who is signed in, which café this session works on and, for an owner, the
 * cafés of their group they may choose between (empty for anyone else, and signed out). */
export interface SessionView {
  user: PublicUser | null;
  cafe: CafeRef | null;
  groupCafes: CafeRef[];
}

/** The signed-in person as the API shows them (GET /api/session). */
export interface PublicUser {
  id: number;
  name: string;
  role: Role;
}

export interface LocationView {
  id: number;
  name: string;
  timeZone: string;
  currency: string;
  taxMode: 'exclusive' | 'inclusive';
  /** Tax rate in thousandths of a percent: 8.25 % is 8250. */
  taxRateMilliPct: number;
  extraShotCents: number;
  waitTargetSeconds: number;
  pickupTimeoutSeconds: number;
  allergenList: 'US' | 'EU';
  baristasOnBar: number;
  receiptFooter: string | null;
  /** The café mails a customer who left an address when the order is ready (Settings); the
   * Counter tells the customer so. Left out by hand-made fixtures: read it with `?? true`. */
  readyMail?: boolean;
  /** Tips at the Counter (Settings). Left out by hand-made fixtures: read it with `?? TIPS_OFF`. */
  tips?: TipSettings;
  jugWasteMl: number;
  /** Display units (src/domain/units.ts); sizes stay in ml. The server always sets them; read them
   * with `?? 'ml'` / `?? 'C'` where a hand-made fixture leaves them out. */
  volumeUnit?: VolumeUnit;
  temperatureUnit?: TemperatureUnit;
  /** How much cold milk grows when steamed, per texture, in %: drink options keep the cup full with it. */
  milkGrowthPct?: Record<SteamedTexture, number>;
}

export interface MilkView {
  id: number;
  name: string;
  /** Two-letter badge shown on lane headers, chosen in the menu. */
  code: string;
  upchargeCents: number;
  /** Worked out from its ingredients for the café's list. */
  allergens: string[];
}

export interface SizeView {
  id: number;
  name: string;
  volumeMl: number;
  priceCents: number;
  shots: number;
  milkMl: number;
  /** Recipe coffee in and espresso out for the size's shots, in tenths of a gram. */
  doseDg: number;
  yieldDg: number;
  /** The size a tap on the tile picks. */
  isDefault: boolean;
  /** The cup the cashier grabs for it ("12 oz hot cup"), set in the menu editor. */
  cup?: string | null;
}

export interface ExtraView {
  id: number;
  groupId: number;
  groupName: string;
  name: string;
  priceCents: number;
  /** Worked out from its ingredients for the café's list. */
  allergens: string[];
  /** What it does at the bar (src/domain/drink-options.ts); null: nothing beyond being named on the card. */
  barEffect?: BarEffect | null;
}

export interface ExtraGroupView {
  id: number;
  name: string;
  selection: 'single' | 'multi';
  required: boolean;
}

export interface MenuItemView {
  id: number;
  categoryId: number;
  name: string;
  station: Station;
  /** Price when the item has no sizes. */
  priceCents: number | null;
  shots: number;
  takesMilk: boolean;
  defaultMilkId: number | null;
  texture: Texture | null;
  available: boolean;
  /** What it contains (src/domain/ingredients.ts), as the owner recorded it. */
  ingredients: string[];
  /** Worked out from the ingredients for the café's list; its milk and extras add their own. */
  allergens: string[];
  sizes: SizeView[];
  /** The extras offered on this item, by group. */
  extraGroupIds: number[];
  /** The item's photo (a WebP of at most 800 px, served by the app); null or absent: none. */
  photoUrl?: string | null;
}

export interface MenuView {
  location: LocationView;
  categories: { id: number; name: string }[];
  items: MenuItemView[];
  milks: MilkView[];
  extraGroups: ExtraGroupView[];
  extras: ExtraView[];
}

export interface MilkRef {
  id: number;
  name: string;
  code: string;
  /** The milk's place in the menu: the Bar keeps its lanes in this order. */
  sort?: number;
}

export interface DrinkView {
  id: number;
  ticketId: number;
  itemName: string;
  sizeName: string | null;
  volumeMl: number | null;
  milk: MilkRef | null;
  shots: number;
  milkMl: number;
  texture: Texture | null;
  /** Asked at kids' temperature: its jug is steamed cooler, apart from the rest (a drink option);
   * absent (a drink sold before options existed): as usual. */
  kidsTemp?: boolean;
  extras: string[];
  note: string | null;
  /** Allergens the drink itself contains (its milk, extras, the item). */
  contains: string[];
  /** Ground coffee for this drink's shots, in tenths of a gram. */
  doseDg: number;
  status: DrinkStatus;
  startedAt: string | null;
  doneAt: string | null;
  /** When a barista confirmed reading the ticket's allergy, and who. */
  allergyAckAt: string | null;
  allergyAckBy: string | null;
  /** Who started making it and who bumped it (names; null until then). */
  startedBy?: string | null;
  doneBy?: string | null;
  /** The jug it was started in, with that jug's pour as started; null if none. */
  jug?: JugRef | null;
  /** Set on a drink made again at no charge (src/domain/remakes.ts); absent otherwise. */
  remake?: RemakeMark;
}

/** A started jug as each of its drinks carries it: fixed from the moment it was started. */
export type JugRef = Omit<Jug, 'jugId' | 'drinkIds'> & { id: number };

export interface TicketView {
  id: number;
  number: number;
  customerName: string;
  status: TicketStatus;
  firedAt: string;
  readyAt: string | null;
  collectedAt: string | null;
  service: Service;
  /** Allergens the customer named, from the location's list, and their own words. */
  allergens: string[];
  allergyNote: string | null;
  /** Set when a lead moved the ticket to the front of the bar. */
  rushedAt: string | null;
  /** Who took the order at the counter (a name). */
  takenBy?: string | null;
  /** Bar drinks only; counter items are collected at the counter. */
  drinks: DrinkView[];
}

export interface OrderLineView {
  id: number;
  menuItemId: number;
  itemName: string;
  station: Station;
  sizeName: string | null;
  milkName: string | null;
  shots: number;
  extras: string[];
  note: string | null;
  priceCents: number;
  /** where the drink stands at the bar ('done' for a counter item) */
  status: DrinkStatus;
  /** when this drink's own money was given back (a drink refund); null if not */
  refundedAt: string | null;
  /** set on a drink made again at no charge */
  remake: RemakeMark | null;
  /** the line that remade this one, if any */
  remadeAs: number | null;
}

export interface OrderView {
  id: number;
  clientOrderId: string;
  number: number;
  customerName: string;
  status: TicketStatus;
  paymentStatus: PaymentStatus;
  service: Service;
  allergens: string[];
  allergyNote: string | null;
  customerEmail: string | null;
  lines: OrderLineView[];
  subtotalCents: number;
  discountCents: number;
  discountReason: string | null;
  taxCents: number;
  totalCents: number;
  /** the customer's tip, outside the total (never taxed); they paid totalCents + tipCents */
  tipCents: number;
  /** everything given back, the tip included once the order's total is back */
  refundedCents: number;
  payment: {
    /** split: paid in parts, listed in `parts` */
    method: 'cash' | 'card' | 'split';
    tenderedCents: number | null;
    changeCents: number | null;
    /** The provider's id of the successful card payment (the first card part's on a split). */
    providerId: string | null;
    /** The parts paid so far, the first first: one for an order paid at once. */
    parts: PaidPart[];
  };
  changeCents: number | null;
  quotedWaitSeconds: number | null;
  takenBy: string | null;
  createdAt: string;
  firedAt: string | null;
  voidReason: string | null;
}

export const TICKET_EVENT_TYPES = [
  'order.taken',
  'order.fired',
  'order.voided',
  'order.refunded',
  'drink.started',
  'drink.bumped',
  'ticket.bumped',
  'ticket.recalled',
  'drink.remade',
  'ticket.rushed',
  'ticket.collected',
  'drink.allergy_acknowledged',
] as const;
export type TicketEventType = (typeof TICKET_EVENT_TYPES)[number];
export type EventType = TicketEventType | 'menu.availability' | 'menu.changed' | 'shift.changed' | 'beans.changed';

/** One row of the realtime log about a ticket; `seq` is its id and strictly increases. */
export interface LiveEvent {
  seq: number;
  type: TicketEventType;
  at: string;
  ticket: TicketView;
}

/** An item was 86'd or is back. */
export interface MenuEvent {
  seq: number;
  type: 'menu.availability';
  at: string;
  item: { id: number; available: boolean };
}

export interface ShiftView {
  id: number;
  openedAt: string;
  openedBy: string;
  openingFloatCents: number;
  baristasOnBar: number;
  waitTargetSeconds: number;
  closedAt: string | null;
  closedBy: string | null;
  expectedCashCents: number | null;
  countedCashCents: number | null;
  closeNote: string | null;
}

/** A shift was opened, changed (baristas on bar) or closed. */
export interface ShiftEvent {
  seq: number;
  type: 'shift.changed';
  at: string;
  shift: ShiftView;
}

/** The back office changed the menu (items, sizes, prices, milks…): screens reload it. */
export interface MenuChangedEvent {
  seq: number;
  type: 'menu.changed';
  at: string;
}

/** A dial-in shot was logged: the Bar's "on the grinder" line reloads. */
export interface BeansChangedEvent {
  seq: number;
  type: 'beans.changed';
  at: string;
}

export type AnyLiveEvent = LiveEvent | MenuEvent | MenuChangedEvent | ShiftEvent | BeansChangedEvent;

export const isTicketEvent = (e: AnyLiveEvent): e is LiveEvent =>
  e.type !== 'menu.availability' && e.type !== 'menu.changed' && e.type !== 'shift.changed' && e.type !== 'beans.changed';

export interface BoardSnapshot {
  seq: number;
  now: string;
  location: {
    name: string;
    waitTargetSeconds: number;
    pickupTimeoutSeconds: number;
    /** What the Bar says volumes in (cups, pitchers, fills); absent in an older snapshot: ml. */
    volumeUnit?: VolumeUnit;
    /** Pitchers, waste, drinks per jug and milk growth: what the Bar plans jugs with. */
    jugRules: JugRules;
  };
  tickets: TicketView[];
}

/** Messages the server sends over the live socket. */
export type ServerMessage =
  | { type: 'hello'; seq: number }
  | { type: 'event'; event: AnyLiveEvent }
  | { type: 'snapshot'; snapshot: BoardSnapshot }
  | { type: 'pong' }
  | { type: 'error'; code: string; message: string };
