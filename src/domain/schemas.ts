// Request bodies, query strings and socket messages, written once and used by both the forms
// and the server routes.
import { z } from 'zod';
import { cupsOf, MAX_CUPS, MAX_QUANTITY } from './order-quantity';
import { TICKET_SORTS } from './reports';
import { daysInRange, MAX_REPORT_DAYS } from './report-days';
import { SCREENS, type ScreenId } from './screens';
import { REMAKE_REASONS } from './remakes';
import { plainText } from './text';
import { SPLIT_PARTS_MAX } from './split-payment';
import { TIP_MAX_CENTS } from './tips';

export const signInBody = z.object({
  username: plainText().min(1, 'Enter your sign-in name').max(64),
  password: z.string().min(1, 'Enter your password').max(72, 'Passwords are at most 72 characters'),
});
export type SignInBody = z.infer<typeof signInBody>;

export const idParam = z.object({ id: z.coerce.number().int().positive() });

const extraIdList = z.array(z.number().int().positive()).max(12, 'A drink takes at most 12 extras');

export const orderLineInput = z
  .object({
    menuItemId: z.number().int().positive(),
    sizeId: z.number().int().positive().optional(),
    milkId: z.number().int().positive().optional(),
    shots: z.number().int().min(0).max(8).optional(),
    extraIds: extraIdList.optional(),
    /** extraIds' name before it was renamed: a Counter page loaded before an upgrade, or an order it
     * queued offline then, still sends it, and its extras must not be dropped. */
    modifierIds: extraIdList.optional(),
    note: plainText().max(140, 'A note for the bar is at most 140 characters').optional(),
    /** Cups of this same drink; the server makes one drink of each (see order-quantity.ts). */
    quantity: z
      .number('Say how many')
      .int('Say how many as a whole number')
      .min(1, 'A line holds at least 1')
      .max(MAX_QUANTITY, `A line holds at most ${MAX_QUANTITY}`)
      .optional(),
  })
  .transform(({ modifierIds, ...line }) => (line.extraIds === undefined && modifierIds !== undefined ? { ...line, extraIds: modifierIds } : line));

export type OrderLineInput = z.infer<typeof orderLineInput>;

export const cashPayment = z.object({
  method: z.literal('cash'),
  tenderedCents: z.number().int().min(0).max(10_000_00),
});

/** A card from the Counter's card reader, as the payment provider's payment method id. */
export const cardPayment = z.object({
  method: z.literal('card'),
  paymentMethod: z.string().regex(/^pm_[A-Za-z0-9_]{1,60}$/, 'Not a payment method id'),
});

const partAmount = z.number({ error: 'An amount in cents' }).int('Whole cents').min(1, 'A part is at least 1 cent').max(10_000_00);

/** One part of a split payment: cash handed over at the till (with what was tendered), or one card. */
export const paymentPart = z.discriminatedUnion('method', [
  cashPayment.extend({ amountCents: partAmount }).refine((p) => p.tenderedCents >= p.amountCents, {
    message: 'The cash tendered is less than this part',
    path: ['tenderedCents'],
  }),
  cardPayment.extend({ amountCents: partAmount }),
]);
export type PaymentPart = z.infer<typeof paymentPart>;

/**
 * An order paid in parts (src/domain/split-payment.ts). Part n of the list is part n of the order
 * every time it is sent: a part already paid is not taken again, so a declined card is replaced by
 * sending the same list with another card in its place.
 */
export const splitPayment = z.object({
  method: z.literal('split'),
  parts: z.array(paymentPart).min(2, 'A split has at least 2 parts').max(SPLIT_PARTS_MAX, `A split has at most ${SPLIT_PARTS_MAX} parts`),
});

export const discountInput = z.object({
  kind: z.enum(['percent', 'amount']),
  /** whole percent (1–100) or cents */
  value: z.number().int().positive().max(100_000),
  reason: plainText().min(3, 'Say why the discount is given').max(120),
});
export type DiscountInput = z.infer<typeof discountInput>;

export const createOrderBody = z.object({
  clientOrderId: z.uuid(),
  // Each limit said in words naming the field: the cashier reads these (not the validator's own).
  customerName: plainText().min(1, 'Enter the customer name').max(40, 'A name for the cup is at most 40 characters'),
  service: z.enum(['takeaway', 'dine_in']).default('takeaway'),
  allergens: z.array(plainText().min(1, 'Name the allergen').max(40, 'An allergen is at most 40 characters')).max(14, 'At most 14 allergens').default([]),
  allergyNote: plainText().max(200, 'An allergy note is at most 200 characters').optional(),
  customerEmail: z.email('Not an e-mail address').max(254, 'An e-mail address is at most 254 characters').optional(),
  discount: discountInput.optional(),
  items: z
    .array(orderLineInput)
    .min(1, 'Add at least one item')
    .max(40, 'An order holds at most 40 lines')
    .refine((items) => cupsOf(items) <= MAX_CUPS, `An order holds at most ${MAX_CUPS} drinks and items`),
  /** The customer's tip in cents, on top of the total (never taxed); only when the café takes tips. */
  tipCents: z
    .number({ error: 'Tip: an amount in cents' })
    .int('Tip: whole cents')
    .min(0, 'Tip: not below 0')
    .max(TIP_MAX_CENTS, `Tip: at most ${TIP_MAX_CENTS} cents`)
    .optional(),
  payment: z.discriminatedUnion('method', [cashPayment, cardPayment, splitPayment]),
});
export type CreateOrderBody = z.infer<typeof createOrderBody>;

/**
 * GET /api/tickets. `view=open` (the default): the tickets still at the bar. `view=board`: the
 * whole board, those plus the ready ones still inside the Pickup timeout. No other key is read, so
 * a caller still sending the retired `status=` is told so (400) rather than answered the default.
 */
export const ticketsQuery = z.strictObject({
  view: z.enum(['open', 'board']).default('open'),
});

export const ordersQuery = z.object({
  q: plainText().max(40).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(100),
});

export const refundBody = z.object({
  /** Leave out to refund everything still refundable. */
  amountCents: z.number().int().positive().optional(),
  /** One part of a split order (its payment's id); left out, the parts are refunded last paid first. */
  paymentId: z.number().int().positive().optional(),
  reason: plainText().min(3, 'Say why').max(200),
});

export const voidBody = z.object({ reason: plainText().min(3, 'Say why').max(200) });

/** One drink's own money back (src/domain/remakes.ts works out how much). */
export const drinkRefundBody = z.object({ reason: plainText().min(3, 'Say why').max(200) });

/** One drink made again at no charge: a reason from the list, and a note ("other" needs one). */
export const remakeBody = z
  .object({
    reason: z.enum(REMAKE_REASONS, 'Choose a reason'),
    note: plainText().max(140).optional(),
  })
  .refine((b) => b.reason !== 'other' || (b.note ?? '').length >= 3, { path: ['note'], message: 'Say what went wrong' });

/** A batch of drinks to start or bump in one command. */
export const drinkBatchBody = z.object({
  drinkIds: z
    .array(z.number().int().positive())
    .min(1, 'Name at least one drink')
    .max(30)
    .refine((ids) => new Set(ids).size === ids.length, 'A drink is listed twice'),
});

export const availabilityBody = z.object({ available: z.boolean() });

/** Messages a screen may send over the live socket. */
export const clientMessage = z.discriminatedUnion('type', [
  z.object({
    type: z.literal('resume'),
    since: z.number().int().min(0),
    /** The screen the socket serves; wall screens (Bar, Pickup) keep their session alive. */
    screen: z.enum(Object.keys(SCREENS) as [ScreenId, ...ScreenId[]]).optional(),
  }),
  z.object({ type: z.literal('ping') }),
]);
export type ClientMessage = z.infer<typeof clientMessage>;

/** The Counter's form: the order without its id and payment, which are added on send. */
export const orderDraft = createOrderBody.pick({
  customerName: true,
  service: true,
  allergens: true,
  allergyNote: true,
  items: true,
});
export type OrderDraft = z.infer<typeof orderDraft>;
/** The form's own values, before zod fills in defaults. */
export type OrderDraftInput = z.input<typeof orderDraft>;

/** Where to mail an order's receipt; 254 is the longest address SMTP carries (RFC 5321 errata). */
export const receiptEmailBody = z.object({
  email: z.email('Enter an e-mail address like name@example.com').max(254),
});
export type ReceiptEmailBody = z.infer<typeof receiptEmailBody>;

export const openShiftBody = z.object({
  openingFloatCents: z.number().int().min(0).max(1_000_000),
  baristasOnBar: z.number().int().min(1).max(20),
  waitTargetSeconds: z.number().int().min(60).max(3600),
});

export const baristasBody = z.object({ baristasOnBar: z.number().int().min(1).max(20) });

export const closeShiftBody = z.object({
  countedCashCents: z.number().int().min(0).max(10_000_000),
  note: plainText().max(200).optional(),
  /** the lead saw how many tickets are still open at the bar and closes anyway */
  confirmOpenTickets: z.boolean().optional(),
});

/** A café-local calendar date, YYYY-MM-DD, that exists on the calendar. */
export const calendarDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-02')
  .refine((d) => {
    const t = Date.parse(`${d}T00:00:00Z`);
    return Number.isFinite(t) && new Date(t).toISOString().slice(0, 10) === d;
  }, 'There is no such date');

const fromNotAfterTo = (r: { from?: string; to?: string }) => !r.from || !r.to || r.from <= r.to;
const rangeOrder = { message: 'The range ends before it starts', path: ['to'] };

/** GET /api/reports/range and range.csv: both days included. */
export const reportRangeQuery = z.object({ from: calendarDate, to: calendarDate }).refine(fromNotAfterTo, rangeOrder);

/** GET /api/reports/days and days.csv: the range's dates, both included, at most a year of them. */
export const reportDaysQuery = z
  .object({ from: calendarDate, to: calendarDate })
  .refine(fromNotAfterTo, rangeOrder)
  .refine((r) => daysInRange(r.from, r.to) <= MAX_REPORT_DAYS, { message: `Pick at most ${MAX_REPORT_DAYS} days`, path: ['to'] });

const ticketFilterFields = {
  from: calendarDate.optional(),
  to: calendarDate.optional(),
  /** part of a name, or a ticket number; empty means no search */
  q: plainText()
    .max(40)
    .optional()
    .transform((q) => q || undefined),
  status: z.enum(['pending', 'open', 'ready', 'collected', 'void']).optional(),
  sort: z.enum(TICKET_SORTS).default('createdAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
};

/** GET /api/reports/tickets: filtered, sorted and paged on the server. */
export const ticketHistoryQuery = z
  .object({
    ...ticketFilterFields,
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  })
  .refine(fromNotAfterTo, rangeOrder);
export type TicketHistoryQuery = z.infer<typeof ticketHistoryQuery>;

/** GET /api/reports/tickets.csv: the same filter and order, every matching row. */
export const ticketCsvQuery = z.object(ticketFilterFields).refine(fromNotAfterTo, rangeOrder);
