// What the Reports screen, the CSV exports and the shift-close mail show. Money in integer cents,
// times as ISO-8601 UTC strings, dates as the café's own calendar dates (YYYY-MM-DD).
import type { RemakeWaste } from './remakes';
import type { WaitSummary } from './stats';
import type { TicketStatus } from './types';

export interface ReportShift {
  id: number;
  openedAt: string;
  closedAt: string | null;
}

export interface ReportPeriod {
  kind: 'shift' | 'range';
  /** Café-local dates; for a shift, the dates it opened and closed (or today, while open). */
  from: string;
  to: string;
  shift?: ReportShift & { waitTargetSeconds: number; cash: ShiftCash };
}

/** A shift's drawer and what it left at the bar, as the lead closed it (nulls while it is open). */
export interface ShiftCash {
  openedBy: string | null;
  closedBy: string | null;
  openingFloatCents: number;
  /** at close; while open, what the drawer should hold now */
  expectedCashCents: number;
  countedCashCents: number | null;
  /** counted − expected: below zero the drawer is short */
  differenceCents: number | null;
  closeNote: string | null;
  openTicketsAtClose: number | null;
  oldestOpenWaitSecondsAtClose: number | null;
}

export interface TipTotals {
  cents: number;
  cashCents: number;
  cardCents: number;
}

/** A period without tips. */
export const NO_TIPS: TipTotals = { cents: 0, cashCents: 0, cardCents: 0 };

/** Tips of several periods (days, cafés in one currency) added up. */
export function sumTips(list: TipTotals[]): TipTotals {
  return list.reduce((t, x) => ({ cents: t.cents + x.cents, cashCents: t.cashCents + x.cashCents, cardCents: t.cardCents + x.cardCents }), NO_TIPS);
}

export interface MoneyByMethod {
  orders: number;
  /** total_cents of the method's paid and refunded orders, before refunds (sums to grossCents) */
  cents: number;
}

export interface OverTargetTicket {
  orderId: number;
  businessDate: string;
  number: number;
  customerName: string;
  waitSeconds: number;
}

export interface HourRow {
  /** café-local hour the order was taken, 0–23 */
  hour: number;
  orders: number;
  drinks: number;
  cents: number;
  medianWaitSeconds: number | null;
}

/**
 * One period's numbers. Money and order counts cover the orders that were paid (paid or refunded,
 * in part or in full); never-paid orders (pending, voided unpaid) count nowhere. Milk, shots and
 * coffee are what the bar made: drinks bumped done, whatever happened to the payment later.
 */
export interface ReportView {
  period: ReportPeriod;
  currency: string;
  locale: string;
  timeZone: string;
  /** the wait target the over-target figures use: the shift's, else the café's */
  targetSeconds: number;
  orders: number;
  /** bar drinks sold */
  drinks: number;
  grossCents: number;
  taxCents: number;
  discountCents: number;
  refundsCents: number;
  /** grossCents − refundsCents */
  netCents: number;
  /** the customers' tips, kept (less tips refunded): never in gross, net or tax */
  tips: TipTotals;
  /** drinks made again at no charge, per reason, with what the replaced drinks took */
  remakes: RemakeWaste;
  paymentMix: { cash: MoneyByMethod; card: MoneyByMethod };
  /** fired → ready, in seconds, of the tickets with bar drinks that reached ready */
  waits: WaitSummary;
  /** the longest waits past the target, longest first (at most 20) */
  overTarget: OverTargetTicket[];
  milkUsedMl: { milk: string; ml: number }[];
  shotsPulled: number;
  /** ground coffee for the shots pulled, in 0.1 g */
  coffeeUsedDg: number;
  /** the ten items sold most often (line count), with their line prices before discount */
  topItems: { item: string; count: number; cents: number }[];
  /** hours with paid orders, earliest first */
  hourly: HourRow[];
}

export interface ReportShiftsView {
  /** the café's date now, for "Today" */
  today: string;
  timeZone: string;
  shifts: ReportShift[];
}

export const TICKET_SORTS = ['number', 'createdAt', 'wait', 'total', 'customer'] as const;
export type TicketSort = (typeof TICKET_SORTS)[number];

export interface TicketHistoryRow {
  id: number;
  businessDate: string;
  number: number;
  customerName: string;
  status: TicketStatus;
  paymentStatus: 'unpaid' | 'paid' | 'refunded';
  paymentMethod: 'cash' | 'card' | 'split';
  totalCents: number;
  refundedCents: number;
  createdAt: string;
  readyAt: string | null;
  /** fired → ready; null without bar drinks or before ready */
  waitSeconds: number | null;
  /** bar drinks on the ticket */
  drinks: number;
}

export interface TicketHistoryPage {
  rows: TicketHistoryRow[];
  total: number;
  page: number;
  pageSize: number;
}

/** 1250 ml → "1.25 L"; 0.4 L shown as "0.40 L" so a column of litres lines up. */
export function formatLitres(ml: number, locale = 'en-US'): string {
  return `${new Intl.NumberFormat(locale, { minimumFractionDigits: 2, maximumFractionDigits: 2 }).format(ml / 1000)} L`;
}

/** Coffee in 0.1 g: under a kilo in grams ("812.5 g"), else kilos ("1.42 kg"). */
export function formatCoffee(dg: number, locale = 'en-US'): string {
  const grams = dg / 10;
  if (grams < 1000) return `${new Intl.NumberFormat(locale, { maximumFractionDigits: 1 }).format(grams)} g`;
  return `${new Intl.NumberFormat(locale, { minimumFractionDigits: 2, maximumFractionDigits: 2 }).format(grams / 1000)} kg`;
}

/** 0.125 → "12.5 %"; null → "—". */
export function formatShare(share: number | null, locale = 'en-US'): string {
  if (share === null) return '—';
  return new Intl.NumberFormat(locale, { style: 'percent', maximumFractionDigits: 1 }).format(share);
}

/** 163042 → "163,042". */
export const formatCount = (n: number, locale = 'en-US') => new Intl.NumberFormat(locale).format(n);

/**
 * Hour rows in the order they were worked, from the hour the period starts: a shift opened at
 * 22:00 reads 22, 23, 0, 1 — not 0, 1, 22, 23. A calendar range starts at 0.
 */
export function inHourOrder<T extends { hour: number }>(rows: T[], firstHour = 0): T[] {
  const place = (h: number) => (h - firstHour + 24) % 24;
  return [...rows].sort((a, b) => place(a.hour) - place(b.hour));
}

/** 7 → "07:00". */
export const hourLabel = (hour: number) => `${String(hour).padStart(2, '0')}:00`;
