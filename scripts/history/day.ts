// One café day of history, planned in memory and written later in one go: the shift, every order
// with its lines, payment, bar timing and the odd refund. Pure: the same seed and date give the
// same day, whatever else the run does.
import { createHash } from 'node:crypto';
import type { ResolvedLine } from '@/domain/order-lines';
import { arrivalTimes, CLOSE_SECONDS, OPEN_SECONDS, ordersOnDay } from './arrivals';
import { openBar, type DrinkTiming } from './bar';
import { basket, type MenuIndex } from './basket';
import { iso, localDayStartMs, weekday } from './calendar';
import { fakeId, payment, priceOrder, refund, type Payment, type Priced, type RefundPlan } from './checkout';
import { FIRST_NAMES } from './names';
import { createRandom, type Random } from './random';

export interface Staff {
  lead: number;
  cashier: number;
  /** done_by on the bar: the café's two baristas. */
  baristas: number[];
}

export interface DayContext {
  locationId: number;
  menu: MenuIndex;
  staff: Staff;
  seed: number;
}

export interface OrderPlan {
  number: number;
  clientOrderId: string;
  customerName: string;
  service: 'takeaway' | 'dine_in';
  takenBy: number;
  priced: Priced;
  payment: Payment;
  quotedWaitSeconds: number;
  createdAt: string;
  readyAt: string;
  collectedAt: string;
  /** Bar timing, one per line; null for counter lines. */
  drinks: ({ startedAt: string; doneAt: string; doneBy: number } | null)[];
  refund: (RefundPlan & { providerId: string | null; createdAt: string }) | null;
}

export interface ShiftPlan {
  openedAt: string;
  closedAt: string;
  openingFloatCents: number;
  baristasOnBar: number;
  waitTargetSeconds: number;
  expectedCashCents: number;
  countedCashCents: number;
  closeNote: string | null;
}

export interface DayPlan {
  date: string;
  shift: ShiftPlan;
  orders: OrderPlan[];
}

export const OPENING_FLOAT_CENTS = 150_00;

/** A UUID (version 5 layout over SHA-1) named by café, day and number: the same slot, the same id. */
export function historyOrderId(locationId: number, date: string, number: number): string {
  const h = createHash('sha1').update(`jugline-history/${locationId}/${date}/${number}`).digest();
  h[6] = (h[6] & 0x0f) | 0x50;
  h[8] = (h[8] & 0x3f) | 0x80;
  const x = h.subarray(0, 16).toString('hex');
  return `${x.slice(0, 8)}-${x.slice(8, 12)}-${x.slice(12, 16)}-${x.slice(16, 20)}-${x.slice(20)}`;
}

function timeDrinks(lines: ResolvedLine[], timings: DrinkTiming[], at: (s: number) => string, baristas: number[]) {
  let next = 0;
  return lines.map((l) => {
    if (l.station !== 'bar') return null;
    const t = timings[next++];
    return { startedAt: at(t.startedAt), doneAt: at(t.doneAt), doneBy: baristas[t.barista] };
  });
}

function closeCount(expected: number, random: Random) {
  if (!random.chance(0.15)) return { counted: expected, note: null };
  const off = random.int(1, 9) * (random.chance(0.5) ? 1 : -1);
  return { counted: expected + off, note: `Till ${Math.abs(off)}¢ ${off > 0 ? 'over' : 'short'} at the count` };
}

export function planDay(ctx: DayContext, date: string): DayPlan {
  const random = createRandom(`${ctx.seed}/${date}`);
  const { location } = ctx.menu.menu;
  const dayStart = localDayStartMs(date, location.timeZone);
  const at = (seconds: number) => iso(dayStart + Math.round(seconds * 1000));
  const day = weekday(date);
  const month = Number(date.slice(5, 7));
  const baristasOnBar = day === 6 ? 3 : 2;
  const bar = openBar(baristasOnBar, ctx.staff.baristas.length, random);

  const orders: OrderPlan[] = arrivalTimes(ordersOnDay(day, random), random).map((arrival, i) => {
    const priced = priceOrder(ctx.menu.menu, basket(ctx.menu, random, month), random);
    const paid = payment(priced.totals.totalCents, random);
    const barDrinks = priced.lines.filter((l) => l.station === 'bar').length;
    const timing = bar.take(arrival, barDrinks);
    const back = refund(priced, location.taxRateMilliPct, location.taxMode, random);
    const refundAt = timing.collectedAt + random.between(120, 1800);
    return {
      number: i + 1,
      clientOrderId: historyOrderId(ctx.locationId, date, i + 1),
      customerName: random.pick(FIRST_NAMES),
      service: random.chance(0.3) ? 'dine_in' : 'takeaway',
      takenBy: priced.discount || random.chance(0.15) ? ctx.staff.lead : ctx.staff.cashier,
      priced,
      payment: paid,
      quotedWaitSeconds: timing.quotedWaitSeconds,
      createdAt: at(arrival),
      readyAt: at(timing.readyAt),
      collectedAt: at(timing.collectedAt),
      drinks: timeDrinks(priced.lines, timing.drinks, at, ctx.staff.baristas),
      refund: back && {
        ...back,
        providerId: paid.method === 'card' ? fakeId('re_hist_', random) : null,
        // the customer comes back later that day, before closing
        createdAt: at(Math.min(refundAt, Math.max(timing.collectedAt + 60, CLOSE_SECONDS - 60))),
      },
    };
  });

  let cash = OPENING_FLOAT_CENTS;
  for (const o of orders) {
    if (o.payment.method !== 'cash') continue;
    cash += o.priced.totals.totalCents - (o.refund?.amountCents ?? 0);
  }
  const count = closeCount(cash, random);
  return {
    date,
    shift: {
      openedAt: at(OPEN_SECONDS),
      closedAt: at(CLOSE_SECONDS),
      openingFloatCents: OPENING_FLOAT_CENTS,
      baristasOnBar,
      waitTargetSeconds: location.waitTargetSeconds,
      expectedCashCents: cash,
      countedCashCents: count.counted,
      closeNote: count.note,
    },
    orders,
  };
}
