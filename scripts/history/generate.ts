// Fill a database with an invented year (or any number of days) of service ending yesterday,
// café-local: migrate, load the demo café into an empty database (a SQLite file or PostgreSQL),
// then plan and write day by day.
import { rangeDays } from '@server/reports/days';
import { loadReportLocation } from '@server/reports/scope';
import { isPostgresUrl } from '@server/db/dialect';
import { createDb, migrate } from '@server/db/knex';
import { loadMenu } from '@server/menu/menu';
import { isEmpty, seedDemoCafe } from '@seeds/demo-cafe';
import { indexMenu } from './basket';
import { businessDate, daysEndingYesterday } from './calendar';
import { planDay, type Staff } from './day';
import { dayWriter } from './store';

export interface HistoryOptions {
  /** The database: a SQLite file, or a postgres:// URL. */
  file: string;
  days: number;
  seed?: number;
  /** Add history beside orders that are there already: days that have orders or a shift are left alone. */
  append?: boolean;
  /** The moment that decides "yesterday"; the wall clock unless given. */
  now?: Date;
  /** bcrypt cost for the demo staff when the café is seeded (tests pass a low one). */
  passwordCost?: number;
}

export interface HistorySummary {
  file: string;
  seed: number;
  firstDate: string | null;
  lastDate: string | null;
  days: number;
  skippedDays: number;
  orders: number;
  items: number;
  payments: number;
  refunds: number;
  seconds: number;
}

export const DEFAULT_SEED = 1;

/** The database already holds history and --append was not given; the CLI exits with code 2. */
export class HistoryRefused extends Error {}

async function staffOf(db: ReturnType<typeof createDb>): Promise<{ locationId: number; staff: Staff }> {
  const lead = await db('users').where({ username: 'lead' }).first('id', 'location_id');
  if (!lead) throw new HistoryRefused("History needs the shift lead 'lead' (the demo café's); this database has no such user.");
  const people = await db('users').where({ location_id: lead.location_id, active: true }).orderBy('id').select('id', 'role');
  const baristas = people
    .filter((p) => p.role === 'barista')
    .slice(0, 2)
    .map((p) => p.id as number);
  const cashier = people.find((p) => p.role === 'cashier')?.id as number | undefined;
  return {
    locationId: lead.location_id,
    staff: { lead: lead.id, cashier: cashier ?? lead.id, baristas: baristas.length ? baristas : [lead.id] },
  };
}

export async function generateHistory(options: HistoryOptions): Promise<HistorySummary> {
  const started = performance.now();
  const now = options.now ?? new Date();
  const seed = options.seed ?? DEFAULT_SEED;
  const db = createDb(options.file);
  try {
    await migrate(db);
    if (await isEmpty(db)) await seedDemoCafe(db, now, options.passwordCost);
    const { locationId, staff } = await staffOf(db);
    const menu = await loadMenu(db, locationId);
    // Today's 86 list says nothing about last year: every item was on sale then.
    const allOnSale = { ...menu, items: menu.items.map((i) => ({ ...i, available: true })) };
    const timeZone = menu.location.timeZone;
    const today = businessDate(now, timeZone);

    const older = await db('orders').where('business_date', '<', today).count<{ n: number }>({ n: '*' }).first();
    if (Number(older?.n ?? 0) > 0 && !options.append) {
      throw new HistoryRefused(
        `${isPostgresUrl(options.file) ? 'The PostgreSQL database' : options.file} already has ${older?.n} orders from before today (${today}). ` +
          'Use a fresh file, or pass --append to fill only the days that have no orders yet.',
      );
    }
    const taken = new Set<string>((await db('orders').where({ location_id: locationId }).distinct('business_date')).map((r) => r.business_date as string));
    for (const s of await db('shifts').where({ location_id: locationId }).select('opened_at')) {
      taken.add(businessDate(new Date(s.opened_at), timeZone));
    }
    const dates = daysEndingYesterday(now, timeZone, options.days);
    const todo = dates.filter((d) => !taken.has(d));

    const summary: HistorySummary = {
      file: options.file,
      seed,
      firstDate: todo[0] ?? null,
      lastDate: todo[todo.length - 1] ?? null,
      days: 0,
      skippedDays: dates.length - todo.length,
      orders: 0,
      items: 0,
      payments: 0,
      refunds: 0,
      seconds: 0,
    };
    const ctx = { locationId, menu: indexMenu(allOnSale), staff, seed };
    const writer = await dayWriter(db, locationId, staff.lead);
    for (const date of todo) {
      const written = await writer.write(planDay(ctx, date));
      summary.days++;
      summary.orders += written.orders;
      summary.items += written.items;
      summary.payments += written.payments;
      summary.refunds += written.refunds;
    }
    // Store the reports' per-day rollups now, so the first report over the year is as fast as the rest.
    if (todo.length > 0) await rangeDays(db, await loadReportLocation(db, locationId), todo[0], todo[todo.length - 1], now);
    summary.seconds = (performance.now() - started) / 1000;
    return summary;
  } finally {
    await db.destroy();
  }
}
