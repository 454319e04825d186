// How a refund is planned over an order's paid parts, checked against the parts as one read gives
// them. The order's own running total (orders.refunded_cents) is read at another moment, so a
// refund landing between the two reads once let a plan ask a part for more than it held: a
// RangeError, a 500 to the second of two refunds of one drink sent at once (seen on PostgreSQL).
import { describe, expect, it } from 'vitest';
import type { PaidPart } from '@/domain/split-payment';
import { DomainError } from '@server/domain-errors';
import { planRefund } from '@server/orders/refunds';

const cash = (part: number, amountCents: number, refundedCents = 0): PaidPart => ({
  paymentId: 100 + part,
  part,
  method: 'cash',
  amountCents,
  tenderedCents: amountCents,
  changeCents: 0,
  refundedCents,
});

function refusal(run: () => unknown): DomainError {
  try {
    run();
  } catch (err) {
    if (err instanceof DomainError) return err;
    throw err;
  }
  throw new Error('expected a refusal');
}

describe('planRefund', () => {
  // worked by hand: $8.44 paid, $4.98 already given back for one drink, $3.46 left
  it('a drink refund past what the parts still hold is a conflict, not a crash', () => {
    const paid = [cash(1, 844, 498)];
    expect(refusal(() => planRefund(paid, { amountCents: 498, reason: 'Sent twice', orderItemId: 7 })).refusal).toBe('conflict');
  });

  it('an amount past what is left is the field’s fault (400), judged from the parts themselves', () => {
    const err = refusal(() => planRefund([cash(1, 844, 498)], { amountCents: 400, reason: 'Too much' }));
    expect(err.refusal).toBe('invalid');
    expect(err.details).toEqual([{ path: 'amountCents', message: 'At most 346 cents can be refunded' }]);
  });

  it('with nothing left in the parts, a whole-order refund is a conflict', () => {
    expect(refusal(() => planRefund([cash(1, 500, 500), cash(2, 344, 344)], { reason: 'Again' })).refusal).toBe('conflict');
  });

  it('left without an amount, gives back what the parts still hold, the last part first', () => {
    expect(planRefund([cash(1, 500, 200), cash(2, 344, 44)], { reason: 'All' })).toEqual([
      { paymentId: 102, amountCents: 300 },
      { paymentId: 101, amountCents: 300 },
    ]);
  });
});
