// The ticket history: every order of a café, filtered, sorted and paged in SQL.
import type { Knex } from 'knex';
import { caseFoldedSql, containing, containsSql, type Dialect, dialectOf, rawRows } from '@server/db/dialect';
import type { TicketHistoryPage, TicketHistoryRow, TicketSort } from '@/domain/reports';
import type { TicketStatus } from '@/domain/types';
import { BAR_DRINKS, type Sum } from './sql';
import type { Row } from '@server/db/tables';

export interface TicketFilter {
  /** café-local dates, both included; left out: no bound */
  from?: string;
  to?: string;
  /** part of the customer's name, or a ticket number ("12" or "#12") */
  q?: string;
  status?: TicketStatus;
}

export interface TicketQuery extends TicketFilter {
  sort: TicketSort;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/** waitOfOrder (./sql.ts), stored when the ticket became ready */
const WAIT = 'o.wait_seconds';

/** Sort columns by name, never from the request's text. Ties fall back to the order id. */
const SORT_SQL: Record<TicketSort, string> = {
  number: 'o.number',
  createdAt: 'o.created_at',
  wait: WAIT,
  total: 'o.total_cents',
  customer: 'o.customer_name',
};

function whereOf(d: Dialect, locationId: number, f: TicketFilter): { sql: string; bindings: (string | number)[] } {
  const parts = ['o.location_id = ?'];
  const bindings: (string | number)[] = [locationId];
  const where = (sql: string, value: string | number) => {
    parts.push(sql);
    bindings.push(value);
  };
  if (f.from) where('o.business_date >= ?', f.from);
  if (f.to) where('o.business_date <= ?', f.to);
  if (f.status) where('o.status = ?', f.status);
  if (f.q) {
    const number = Number(f.q.replace(/^#/, ''));
    const like = containing(f.q);
    if (Number.isInteger(number) && number > 0) {
      parts.push(`(${containsSql(d, 'o.customer_name')} OR o.number = ?)`);
      bindings.push(like, number);
    } else {
      parts.push(containsSql(d, 'o.customer_name'));
      bindings.push(like);
    }
  }
  return { sql: parts.join(' AND '), bindings };
}

/** A ticket of the history: its order's columns, its wait and its count of bar drinks. */
type HistoryRow = Pick<
  Row<'orders'>,
  | 'id'
  | 'business_date'
  | 'number'
  | 'customer_name'
  | 'status'
  | 'payment_status'
  | 'payment_method'
  | 'total_cents'
  | 'refunded_cents'
  | 'created_at'
  | 'ready_at'
> & { wait: Sum | undefined; drinks: Sum };

function toRow(r: HistoryRow): TicketHistoryRow {
  return {
    id: r.id,
    businessDate: r.business_date,
    number: r.number,
    customerName: r.customer_name,
    status: r.status,
    paymentStatus: r.payment_status,
    paymentMethod: r.payment_method,
    totalCents: r.total_cents,
    refundedCents: r.refunded_cents,
    createdAt: r.created_at,
    readyAt: r.ready_at ?? null,
    waitSeconds: r.wait === null || r.wait === undefined ? null : Number(r.wait),
    drinks: Number(r.drinks),
  };
}

/**
 * Rows in the asked order; `limit` null for all of them (the CSV). The page is chosen on the sort
 * key alone, so the per-ticket columns (wait, drink count) are worked out only for its rows.
 */
export async function ticketRows(db: Knex, locationId: number, q: Omit<TicketQuery, 'page' | 'pageSize'>, limit: number | null, offset = 0) {
  const where = whereOf(dialectOf(db), locationId, q);
  const dir = q.dir === 'asc' ? 'ASC' : 'DESC';
  const key = (k: string) => (q.sort === 'customer' ? caseFoldedSql(dialectOf(db), k) : k);
  // Tickets without a wait sort after those with one, whichever the direction; ties by order id.
  const orderBy = (k: string, id: string) => `${q.sort === 'wait' ? `${k} IS NULL, ` : ''}${key(k)} ${dir}, ${id} ${dir}`;
  const rows = rawRows<HistoryRow>(
    await db.raw(
      `WITH p AS (
         SELECT o.id AS id, ${SORT_SQL[q.sort]} AS k FROM orders o WHERE ${where.sql}
         ORDER BY ${orderBy(SORT_SQL[q.sort], 'o.id')} ${limit === null ? '' : 'LIMIT ? OFFSET ?'}
       )
       SELECT o.id, o.business_date, o.number, o.customer_name, o.status, o.payment_status, o.payment_method,
         o.total_cents, o.refunded_cents, o.created_at, o.ready_at, ${q.sort === 'wait' ? 'p.k' : WAIT} AS wait, ${BAR_DRINKS} AS drinks
       FROM p JOIN orders o ON o.id = p.id
       ORDER BY ${orderBy('p.k', 'p.id')}`,
      limit === null ? where.bindings : [...where.bindings, limit, offset],
    ),
  );
  return rows.map(toRow);
}

export async function ticketHistory(db: Knex, locationId: number, q: TicketQuery): Promise<TicketHistoryPage> {
  const where = whereOf(dialectOf(db), locationId, q);
  const [count] = rawRows<{ total: unknown }>(await db.raw(`SELECT COUNT(*) AS total FROM orders o WHERE ${where.sql}`, where.bindings));
  const rows = await ticketRows(db, locationId, q, q.pageSize, (q.page - 1) * q.pageSize);
  return { rows, total: Number(count.total), page: q.page, pageSize: q.pageSize };
}
