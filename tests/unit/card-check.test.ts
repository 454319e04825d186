// The card check's arithmetic: pairing the card service's charges and refunds of a day with
// Jugline's attempts and refunds, and the day's bounds in the café's zone. What counts as "in
// step" is common practice for an end-of-day card batch check: every charge taken is either
// recorded against a sale or refunded, every refund on one side is on the other, and the two
// sides' net totals agree.
import { describe, expect, it } from 'vitest';
import { autoRefundCause, reconcileDay, type AttemptLine, type ProviderCharge, type ProviderRefundLine, type RefundLine } from '@/domain/card-check';
import { dayBounds } from '@server/reports/local-hours';

const at = (hhmm: string) => `2026-03-05T${hhmm}:00.000Z`;

function charge(providerId: string, paymentId: number | null, status: ProviderCharge['status'], cents: number, hhmm = '15:00'): ProviderCharge {
  return { providerId, paymentId, status, amountCents: cents, receivedCents: status === 'succeeded' ? cents : 0, createdAt: at(hhmm) };
}
function attempt(paymentId: number, orderId: number, status: AttemptLine['status'], cents: number, providerId: string | null, hhmm = '15:00'): AttemptLine {
  return { paymentId, orderId, orderNumber: orderId + 100, status, amountCents: cents, providerId, createdAt: at(hhmm) };
}
function providerRefund(providerId: string, chargeId: string, cents: number, hhmm = '16:00'): ProviderRefundLine {
  return { providerId, chargeId, amountCents: cents, status: 'succeeded', createdAt: at(hhmm) };
}
function refund(refundId: number, orderId: number, cents: number, providerId: string | null, cause: RefundLine['cause'] = null): RefundLine {
  return {
    refundId,
    orderId,
    orderNumber: orderId + 100,
    amountCents: cents,
    reason: cause ? 'automatic' : 'Wrong milk',
    cause,
    providerId,
    createdAt: at('16:00'),
    by: cause ? null : 'Theo Brand',
  };
}

describe('autoRefundCause', () => {
  it('no payment on the order: it was voided; paid in cash: paid another way; paid by card: a duplicate', () => {
    expect(autoRefundCause(null)).toBe('order_voided');
    expect(autoRefundCause('cash')).toBe('paid_otherwise');
    expect(autoRefundCause('card')).toBe('duplicate');
  });
});

describe('reconcileDay', () => {
  it('a day in step: charges recorded or given back, a declined card, refunds on both sides; totals agree', () => {
    const result = reconcileDay({
      provider: {
        charges: [
          charge('pi_a', 1, 'succeeded', 1045),
          charge('pi_b', 2, 'declined', 620, '15:05'),
          charge('pi_c', 3, 'succeeded', 620, '15:06'),
          charge('pi_d', 4, 'succeeded', 480, '15:10'),
        ],
        refunds: [providerRefund('re_1', 'pi_a', 300), providerRefund('re_2', 'pi_d', 480)],
      },
      attempts: [
        attempt(1, 1, 'succeeded', 1045, 'pi_a'),
        attempt(2, 2, 'declined', 620, 'pi_b', '15:05'),
        attempt(3, 2, 'succeeded', 620, 'pi_c', '15:06'),
        attempt(4, 3, 'refunded', 480, 'pi_d', '15:10'),
      ],
      refunds: [refund(1, 1, 300, 're_1'), refund(2, 3, 480, 're_2', 'order_voided')],
    });
    expect(result.charges.map((c) => [c.providerId, c.match, c.note])).toEqual([
      ['pi_a', 'recorded', 'recorded'],
      ['pi_b', 'no_money', 'declined'],
      ['pi_c', 'recorded', 'recorded'],
      ['pi_d', 'given_back', 'given_back'],
    ]);
    expect(result.refunds.map((r) => [r.providerId, r.match, r.automatic, r.by])).toEqual([
      ['re_1', 'matched', false, 'Theo Brand'],
      ['re_2', 'matched', true, null],
    ]);
    // 1045 + 620 + 480 taken; 300 + 480 given back
    expect(result.provider).toEqual({ chargedCents: 2145, refundedCents: 780, netCents: 1365, charges: 3, refunds: 2 });
    expect(result.jugline).toEqual({
      chargedCents: 2145,
      refundedCents: 780,
      netCents: 1365,
      charges: 3,
      refunds: 2,
      recordedCents: 1665,
      givenBackCents: 480,
    });
    expect(result.differenceCents).toBe(0);
    expect(result.mismatches).toBe(0);
  });

  it('explains each kind of mismatch, and the difference is the money not accounted for', () => {
    const result = reconcileDay({
      provider: {
        charges: [
          charge('pi_lost', 10, 'succeeded', 900), // Jugline never heard the answer
          charge('pi_giving', 11, 'succeeded', 500), // the automatic refund isn't confirmed yet
          charge('pi_stranger', null, 'succeeded', 250), // no attempt Jugline knows
          charge('pi_short', 13, 'succeeded', 700), // amounts differ
          charge('pi_open', 14, 'open', 400), // never run, attempt still unknown in Jugline
        ],
        refunds: [providerRefund('re_stray', 'pi_short', 100)],
      },
      attempts: [
        attempt(10, 20, 'unknown', 900, 'pi_lost'),
        attempt(11, 21, 'refunding', 500, 'pi_giving'),
        attempt(13, 23, 'succeeded', 750, 'pi_short'),
        attempt(14, 24, 'unknown', 400, 'pi_open'),
        attempt(15, 25, 'succeeded', 300, 'pi_elsewhere'), // the card service has no such charge on this day
      ],
      refunds: [refund(5, 21, 500, null, 'duplicate'), refund(6, 23, 50, 're_gone')],
    });
    const byId = Object.fromEntries(result.charges.map((c) => [c.providerId, [c.match, c.note, c.providerStatus, c.juglineStatus]]));
    expect(byId).toEqual({
      pi_lost: ['mismatch', 'not_recorded', 'succeeded', 'unknown'],
      pi_giving: ['mismatch', 'refund_pending', 'succeeded', 'refunding'],
      pi_stranger: ['mismatch', 'no_attempt', 'succeeded', null],
      pi_short: ['mismatch', 'amount_differs', 'succeeded', 'succeeded'],
      pi_open: ['no_money', 'unresolved', 'open', 'unknown'],
      pi_elsewhere: ['mismatch', 'no_charge_found', 'missing', 'succeeded'],
    });
    expect(result.refunds.map((r) => [r.providerId, r.match, r.note])).toEqual([
      [null, 'mismatch', 'refund_pending'],
      ['re_gone', 'mismatch', 'refund_not_found'],
      ['re_stray', 'mismatch', 'refund_not_recorded'],
    ]);
    expect(result.mismatches).toBe(8);
    // card service: 900 + 500 + 250 + 700 taken, 100 back = 2250; Jugline: 500 + 750 + 300 taken, 550 back = 1000
    expect(result.provider!.netCents).toBe(2250);
    expect(result.jugline.netCents).toBe(1000);
    expect(result.differenceCents).toBe(1250);
  });

  it("the card service not reached: only Jugline's side, every line unchecked, no difference claimed", () => {
    const result = reconcileDay({ provider: null, attempts: [attempt(1, 1, 'succeeded', 1045, 'pi_a')], refunds: [refund(1, 1, 300, 're_1')] });
    expect(result.provider).toBeNull();
    expect(result.differenceCents).toBeNull();
    expect(result.mismatches).toBe(0);
    expect(result.charges.map((c) => [c.match, c.providerStatus])).toEqual([['unchecked', null]]);
    expect(result.refunds.map((r) => r.match)).toEqual(['unchecked']);
    expect(result.jugline.netCents).toBe(745);
  });
});

describe('dayBounds', () => {
  // US daylight saving time (from memory: Energy Policy Act of 2005) starts on the second Sunday
  // of March at 02:00 local standard time: in 2026, 8 March, so that day has 23 hours in New York.
  it('a New York day is midnight to midnight local time, 23 hours on the day the clocks go forward', () => {
    expect(dayBounds('2026-03-05', 'America/New_York').map((t) => new Date(t).toISOString())).toEqual(['2026-03-05T05:00:00.000Z', '2026-03-06T05:00:00.000Z']);
    const [start, end] = dayBounds('2026-03-08', 'America/New_York');
    expect([new Date(start).toISOString(), new Date(end).toISOString()]).toEqual(['2026-03-08T05:00:00.000Z', '2026-03-09T04:00:00.000Z']);
    expect((end - start) / 3_600_000).toBe(23);
  });

  // India (from memory): UTC+05:30 all year.
  it('a zone ahead of UTC starts the day the evening before, in UTC', () => {
    expect(dayBounds('2026-03-05', 'Asia/Kolkata').map((t) => new Date(t).toISOString())).toEqual(['2026-03-04T18:30:00.000Z', '2026-03-05T18:30:00.000Z']);
  });
});
