// The ticket history (sorted, filtered and paged by the server) and the CSV downloads: a header
// row, a sensible file name, and a customer named "=cmd" written as the text '=cmd, never a formula.
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TicketHistoryPage, TicketHistoryRow } from '@/domain/reports';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';
import { DAY, T0, WAITS, expectedMoney, placeReportDay, type ReportDay } from './reports-fixture';

const time = manualClock(T0);
let server: TestServer;
let lead: Agent;
let day: ReportDay;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  day = await placeReportDay(server, time);
  lead = await server.signIn('lead');
});
afterAll(() => server.close());

async function history(query: string): Promise<TicketHistoryPage> {
  const res = await lead.get(`/api/reports/tickets?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}
const numbers = (rows: TicketHistoryRow[]) => rows.map((r) => r.number);
const csvRows = (text: string) => Papa.parse<string[]>(text.trim(), { skipEmptyLines: true }).data;

describe('GET /api/reports/tickets', () => {
  it("a row per order of the day, voided and pending too, with the ticket's wait and bar drinks", async () => {
    const page = await history(`from=${DAY}&to=${DAY}&sort=number&dir=asc&pageSize=50`);
    expect(page).toMatchObject({ total: 7, page: 1, pageSize: 50 });
    expect(numbers(page.rows)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    const [ada, , cora, dev] = day.inShift;
    expect(page.rows[0]).toEqual({
      id: ada.id,
      businessDate: DAY,
      number: 1,
      customerName: 'Ada Finch',
      status: 'ready',
      paymentStatus: 'paid',
      paymentMethod: 'cash',
      totalCents: ada.totalCents,
      refundedCents: 150,
      createdAt: T0,
      readyAt: '2026-03-02T14:02:00.000Z',
      waitSeconds: 120,
      drinks: 1,
    });
    expect(page.rows[2]).toMatchObject({ id: cora.id, drinks: 2, waitSeconds: 300 });
    expect(page.rows[3]).toMatchObject({ id: dev.id, paymentStatus: 'refunded', paymentMethod: 'card', refundedCents: dev.totalCents });
    // counter-only ('=cmd'), voided and still-open tickets have no wait
    expect(page.rows.slice(4).map((r) => [r.customerName, r.status, r.waitSeconds])).toEqual([
      ['=cmd', 'collected', null],
      ['Faye Norn', 'void', null],
      ['Gus Ware', 'open', null],
    ]);
  });

  it('pages: three a page, the last one short, past the end empty', async () => {
    const q = 'sort=number&dir=asc&pageSize=3';
    expect(numbers((await history(`${q}&page=1`)).rows)).toEqual([1, 2, 3]);
    expect(numbers((await history(`${q}&page=2`)).rows)).toEqual([4, 5, 6]);
    expect(await history(`${q}&page=3`)).toMatchObject({ total: 7, page: 3, pageSize: 3, rows: [expect.objectContaining({ number: 7 })] });
    expect(await history(`${q}&page=4`)).toMatchObject({ total: 7, rows: [] });
  });

  it('sorts by wait (tickets without one last, either way), total, customer and time taken', async () => {
    const waits = (rows: TicketHistoryRow[]) => rows.map((r) => r.waitSeconds);
    expect(waits((await history('sort=wait&dir=desc')).rows)).toEqual([...[...WAITS].reverse(), null, null, null]);
    expect(waits((await history('sort=wait&dir=asc')).rows)).toEqual([...WAITS, null, null, null]);

    const totals = (await history('sort=total&dir=asc')).rows.map((r) => r.totalCents);
    expect(totals).toEqual([...totals].sort((a, b) => a - b));
    expect(totals).toEqual([...day.paid, day.voided].map((o) => o.totalCents).sort((a, b) => a - b));

    const names = (await history('sort=customer&dir=asc')).rows.map((r) => r.customerName);
    expect(names).toEqual(['=cmd', 'Ada Finch', 'Bram Okafor', 'Cora Lind', 'Dev Patel', 'Faye Norn', 'Gus Ware']);
    const desc = (await history('sort=customer&dir=desc')).rows.map((r) => r.customerName);
    expect(desc).toEqual([...names].reverse());

    // default: newest first; the six taken at T0 tie and fall back to the order id
    expect(numbers((await history('')).rows)).toEqual([7, 6, 5, 4, 3, 2, 1]);
  });

  it('filters by name, by number, by status and by date, and counts what matches', async () => {
    expect(await history('q=cora')).toMatchObject({ total: 1, rows: [expect.objectContaining({ customerName: 'Cora Lind' })] });
    expect(numbers((await history('q=%233')).rows)).toEqual([3]); // "#3"
    expect(await history('q=%25')).toMatchObject({ total: 0 }); // a literal "%" matches no name
    expect(numbers((await history('status=ready&sort=number&dir=asc')).rows)).toEqual([1, 2, 3, 4]);
    expect(await history('status=void')).toMatchObject({ total: 1, rows: [expect.objectContaining({ customerName: 'Faye Norn' })] });
    expect(await history('status=ready&q=dev')).toMatchObject({ total: 1 });
    expect(await history('from=2026-03-03')).toMatchObject({ total: 0, rows: [] });
    expect(await history(`to=${DAY}`)).toMatchObject({ total: 7 });
  });
});

describe('CSV downloads', () => {
  it('tickets.csv: every matching row in the asked order, a header row, and "=cmd" neutralised', async () => {
    const res = await lead.get('/api/reports/tickets.csv?sort=number&dir=asc');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="jugline-tickets-all.csv"');
    const rows = csvRows(res.text);
    expect(rows[0]).toEqual([
      'Date',
      'Ticket',
      'Customer',
      'Status',
      'Payment',
      'Method',
      'Total (USD)',
      'Refunded (USD)',
      'Drinks',
      'Taken at (America/New_York)',
      'Ready at (America/New_York)',
      'Wait (s)',
    ]);
    // the café's own clock with its offset (EST is UTC−5 in March before the 8th: 14:00Z is 09:00),
    // and the same status and payment words as the Reports screen
    expect(rows[1].slice(3, 6)).toEqual(['Ready', 'Paid', 'Cash']);
    expect(rows[1].slice(9, 11)).toEqual(['2026-03-02T09:00:00-05:00', '2026-03-02T09:02:00-05:00']);
    expect(res.text).not.toMatch(/"(open|ready|collected|pending|paid|unpaid|cash|card)"/);
    expect(rows.slice(1).map((r) => r[1])).toEqual(['1', '2', '3', '4', '5', '6', '7']);
    const formula = rows.find((r) => r[1] === '5')!;
    expect(formula[2]).toBe("'=cmd");
    expect(res.text).toContain(`"'=cmd"`);
    expect(res.text).not.toMatch(/(^|,)"?=cmd/m);
    expect(rows[1].slice(6, 9)).toEqual([(day.inShift[0].totalCents / 100).toFixed(2), '1.50', '1']);
  });

  it('tickets.csv takes the same filter: a date range names the file', async () => {
    const res = await lead.get(`/api/reports/tickets.csv?from=${DAY}&to=${DAY}&status=ready`);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="jugline-tickets-${DAY}_to_${DAY}.csv"`);
    expect(csvRows(res.text)).toHaveLength(1 + 4);
  });

  it("range.csv and shift/:id.csv: one fact per row, the report's own numbers", async () => {
    const range = await lead.get(`/api/reports/range.csv?from=${DAY}&to=${DAY}`);
    expect(range.status).toBe(200);
    expect(range.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(range.headers['content-disposition']).toBe(`attachment; filename="jugline-report-${DAY}_to_${DAY}.csv"`);
    const rows = csvRows(range.text);
    expect(rows[0]).toEqual(['Section', 'Item', 'Metric', 'Value']);
    const money = expectedMoney(day.paid);
    expect(rows).toContainEqual(['Totals', '', 'gross (USD)', (money.grossCents / 100).toFixed(2)]);
    expect(rows).toContainEqual(['Totals', '', 'net (USD)', (money.netCents / 100).toFixed(2)]);
    expect(rows).toContainEqual(['Waits', '', 'median (s)', '250']);
    expect(rows).toContainEqual(['Over target', `${DAY} #4 Dev Patel`, 'wait (s)', '400']);

    const shift = await lead.get(`/api/reports/shift/${day.shiftId}.csv`);
    expect(shift.status).toBe(200);
    expect(shift.headers['content-disposition']).toBe(`attachment; filename="jugline-shift-${day.shiftId}-${DAY}.csv"`);
    const shiftRows = csvRows(shift.text);
    expect(shiftRows).toContainEqual(['Period', '', 'kind', 'shift']);
    expect(shiftRows).toContainEqual(['Totals', '', 'orders', String(day.inShift.length)]);
  });
});
