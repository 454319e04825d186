// Tips as the reports read them: the paid orders' tips, less what refunds gave back of them, by how
// they were paid. For a report's scope (its Tips tile) and by café-local date (Day by day, and
// Pulse's today); one sum for both, so tests/api/report-days.test.ts can hold each date to its report.
import type { Knex } from 'knex';
import { rawRows } from '@server/db/dialect';
import type { TipTotals } from '@/domain/reports';
import { PAID } from './scope';
import { CASH_TIP, n, TIP_KEPT, type Sum } from './sql';

/** The kept tips of a set of paid orders, cash and card, as one row of SQL (orders aliased `o`). */
const TIP_SUMS = `SUM(${CASH_TIP}) AS cash, SUM(${TIP_KEPT} - (${CASH_TIP})) AS card`;
type TipRow = { cash: Sum; card: Sum };

function tipTotalsOf(r: TipRow | undefined): TipTotals {
  const cash = n(r?.cash);
  const card = n(r?.card);
  return { cents: cash + card, cashCents: cash, cardCents: card };
}

/** The tips of the paid orders matching `where` (the report's scope). */
export async function tipTotals(db: Knex, where: string, bindings: readonly Knex.RawBinding[]): Promise<TipTotals> {
  const rows = rawRows<TipRow>(await db.raw(`SELECT ${TIP_SUMS} FROM orders o WHERE ${where} AND ${PAID} AND o.tip_cents > 0`, [...bindings]));
  return tipTotalsOf(rows[0]);
}

/** The tips of each date from..to (café-local, both included) that has any; a missing date had none. */
export async function tipsByDate(db: Knex, locationId: number, from: string, to: string): Promise<Map<string, TipTotals>> {
  const rows = rawRows<TipRow & { d: string }>(
    await db.raw(
      `SELECT o.business_date AS d, ${TIP_SUMS}
       FROM orders o WHERE o.location_id = ? AND o.business_date BETWEEN ? AND ? AND ${PAID} AND o.tip_cents > 0
       GROUP BY o.business_date`,
      [locationId, from, to],
    ),
  );
  return new Map(rows.map((r) => [r.d, tipTotalsOf(r)]));
}
