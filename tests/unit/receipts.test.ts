// The receipt mail, from an invented order: what a customer needs to read on it, money written in
// the café's currency, and nothing the customer typed able to become markup.
import { describe, expect, it } from 'vitest';
import { receiptEmail } from '@server/orders/receipts';
import { inventedOrder } from '../support/invented-order';

const order = inventedOrder;

const cafe = { name: 'Harbour & Hearth Coffee', currency: 'USD', locale: 'en-US', timeZone: 'America/New_York' };

describe('receiptEmail', () => {
  it('carries the café, the number, the first name, each line with its choices, totals and the change', () => {
    const { subject, text } = receiptEmail(order(), cafe, 'See you tomorrow.');
    expect(subject).toBe('Your receipt from Harbour & Hearth Coffee — order #42');
    expect(text).toContain('Harbour & Hearth Coffee\nReceipt for order #42\nThank you, Maud!');
    expect(text).toContain('Latte — $7.90\n  Large · Oat milk · 3 shots · Vanilla syrup, Extra hot\n  Note: half sweet');
    expect(text).toContain('Butter croissant — $4.25\n\n'); // no empty details line for a plain item
    expect(text).toContain('Subtotal: $12.15\nTax: $1.00\nTotal: $13.15');
    expect(text).not.toContain('Discount');
    expect(text).toContain('Paid in cash: $20.00 · change $6.85');
    // 14:05 UTC is 09:05 in New York on 2 March 2026 (EST, UTC−5)
    expect(text).toMatch(/March 2, 2026 at 9:05\sAM/);
    expect(text).toContain('See you tomorrow.');
  });

  it('shows a discount with its reason, and a card payment without change', () => {
    const { text } = receiptEmail(
      order({
        discountCents: 150,
        discountReason: 'Regular',
        payment: { method: 'card', tenderedCents: null, changeCents: null, providerId: 'pi_1', parts: [] },
      }),
      cafe,
    );
    expect(text).toContain('Discount (Regular): −$1.50');
    expect(text).toContain('Paid by card: $13.15');
    expect(text).not.toContain('change');
  });

  it('says a tip after the total (outside it), then the amount paid; no tip line without one', () => {
    // by hand: total $13.15 + tip $1.97 (15 %) = $15.12 charged to the card; cash $20.00 − $15.12 = $4.88 change
    const card = receiptEmail(
      order({ tipCents: 197, payment: { method: 'card', tenderedCents: null, changeCents: null, providerId: 'pi_1', parts: [] } }),
      cafe,
    );
    expect(card.text).toContain('Tax: $1.00\nTotal: $13.15\nTip: $1.97\nAmount paid: $15.12');
    expect(card.text).toContain('Paid by card: $15.12');
    expect(card.html).toContain('Tip');
    const cash = receiptEmail(
      order({ tipCents: 197, changeCents: 488, payment: { method: 'cash', tenderedCents: 2000, changeCents: 488, providerId: null, parts: [] } }),
      cafe,
    );
    expect(cash.text).toContain('Paid in cash: $20.00 · change $4.88');
    expect(receiptEmail(order(), cafe).text).not.toContain('Tip');
  });

  it('says each part of a split payment', () => {
    // by hand: $13.15 = $5.00 cash (tendered $10.00, $5.00 change) + $8.15 card
    const parts = [
      { paymentId: 1, part: 1, method: 'cash' as const, amountCents: 500, tenderedCents: 1000, changeCents: 500, refundedCents: 0 },
      { paymentId: 2, part: 2, method: 'card' as const, amountCents: 815, tenderedCents: null, changeCents: null, refundedCents: 0 },
    ];
    const { text } = receiptEmail(order({ payment: { method: 'split', tenderedCents: 1000, changeCents: 500, providerId: 'pi_1', parts } }), cafe);
    expect(text).toContain('Paid in 2 parts: Part 1 · cash $5.00 (tendered $10.00, change $5.00); Part 2 · card $8.15');
  });

  it('writes money in the café’s currency and locale', () => {
    const { text } = receiptEmail(order(), { name: 'North Quay Espresso', currency: 'GBP', locale: 'en-GB', timeZone: 'Europe/London' });
    expect(text).toContain('Total: £13.15');
    expect(text).toMatch(/2 March 2026 at 14:05/);
  });

  it('escapes what people typed in the HTML and keeps it as written in the text', () => {
    const { html, text } = receiptEmail(order({ customerName: '<b>Al</b> & co' }), { ...cafe, name: 'Tom "Quote" <Café>' });
    expect(html).not.toContain('<b>Al</b>');
    expect(html).toContain('&#60;b&#62;Al&#60;/b&#62;');
    expect(html).toContain('Tom &#34;Quote&#34; &#60;Café&#62;');
    expect(html).not.toMatch(/<Café>|<b>/);
    expect(text).toContain('Thank you, <b>Al</b>!');
  });
});
