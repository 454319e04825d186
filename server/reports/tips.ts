// Tips by café-local date, for the screens that show a date's tips beside others: Day by day (a
// row per date and the range's total) and Pulse (today's so far). The same sum as the report's
// Tips tile (tipTotals in ./report.ts): the paid orders' tips, less what refunds gave back of them,
// by how they were paid; tests/api/report-days.test.ts holds each date to its own report.
import type { Knex } from 'knex';
import { rawRows } from '@server/db/dialect';
import type { TipTotals } from '@/domain/reports';
import { PAID } from './scope';
import { CASH_TIP, n, TIP_KEPT, type Sum } from './sql';

/** The tips of each date from..to (café-local, both included) that has any; a missing date had none. */
export async function tipsByDate(db: Knex, locationId: number, from: string, to: string): Promise<Map<string, TipTotals>> {
  const rows = rawRows<{ d: string; cash: Sum; card: Sum }>(
    await db.raw(
      `SELECT o.business_date AS d, SUM(${CASH_TIP}) AS cash, SUM(${TIP_KEPT} - (${CASH_TIP})) AS card
       FROM orders o WHERE o.location_id = ? AND o.business_date BETWEEN ? AND ? AND ${PAID} AND o.tip_cents > 0
       GROUP BY o.business_date`,
      [locationId, from, to],
    ),
  );
  return new Map(
    rows.map((r) => {
      const cash = n(r.cash);
      const card = n(r.card);
      return [r.d, { cents: cash + card, cashCents: cash, cardCents: card }];
    }),
  );
}
