// The range report's per-day partials (report_days): a past day's partial is stored the first time
// a range needs it and read back after; the answer is the same as one worked out from the orders;
// a refund on that day drops the stored partial in its own transaction, so the next answer has it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ReportView } from '@/domain/reports';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';
import { DAY, T0, placeReportDay, type ReportDay } from './reports-fixture';

const time = manualClock(T0);
let server: TestServer;
let lead: Agent;
let day: ReportDay;
const RANGE = `/api/reports/range?from=2026-02-25&to=2026-03-05`;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  day = await placeReportDay(server, time);
  lead = await server.signIn('lead');
  time.set('2026-03-05T15:00:00.000Z'); // DAY is a past day now; 5 March is today
});
afterAll(() => server.close());

const get = async (path: string): Promise<ReportView> => {
  const res = await lead.get(path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
};
const storedDays = async () => (await server.db('report_days').orderBy('business_date').select('business_date')).map((r) => r.business_date);

describe('report_days', () => {
  it('stores each past day of a range once, and a stored range answers exactly as a freshly computed one', async () => {
    expect(await storedDays()).toEqual([]);
    const first = await get(RANGE);
    // past days only: 25 February … 4 March; today (5 March) stays live
    expect(await storedDays()).toEqual(['2026-02-25', '2026-02-26', '2026-02-27', '2026-02-28', '2026-03-01', '2026-03-02', '2026-03-03', '2026-03-04']);
    const cached = await get(RANGE);
    await server.db('report_days').delete();
    const fresh = await get(RANGE);
    expect(cached).toEqual(fresh);
    expect(first).toEqual(fresh);
    expect(fresh.orders).toBe(day.paid.length);
    expect(fresh.waits).toMatchObject({ count: 4, medianSeconds: 250 });
    // the same numbers as the day alone, worked out with nothing stored for it
    await server.db('report_days').delete();
    const alone = await get(`/api/reports/range?from=${DAY}&to=${DAY}`);
    expect({ ...fresh, period: alone.period }).toEqual(alone);
  });

  it("a refund of an order on a past day drops that day's row, and the next range answer counts it", async () => {
    const before = await get(RANGE);
    expect(await storedDays()).toContain(DAY);
    const [, , , , formula] = day.inShift;
    const res = await lead.post(`/api/orders/${formula.id}/refund`).send({ amountCents: 100, reason: 'Late complaint' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await storedDays()).not.toContain(DAY);
    expect(await storedDays()).toContain('2026-03-01');
    const after = await get(RANGE);
    expect(after.refundsCents).toBe(before.refundsCents + 100);
    expect(after.netCents).toBe(before.netCents - 100);
    expect(await storedDays()).toContain(DAY);
    await server.db('report_days').delete();
    expect(await get(RANGE)).toEqual(after);
  });
});
