// The ready mail, from an invented order: the number, the name and the drinks the Bar made, why
// the customer gets it, and nothing the customer typed able to become markup.
import { describe, expect, it } from 'vitest';
import { readyEmail } from '@server/orders/ready-mail';
import { inventedOrder } from '../support/invented-order';

const order = inventedOrder;

const latte = order().lines[0];

describe('readyEmail', () => {
  it('names the café, the number, the name on the cup and the drinks; a counter item was handed over already', () => {
    const { subject, text } = readyEmail(order(), 'Harbour & Hearth Coffee');
    expect(subject).toBe('Your order #42 is ready at Harbour & Hearth Coffee');
    expect(text).toContain('Harbour & Hearth Coffee\nOrder #42 is ready, Maud!');
    expect(text).toContain('1 × Latte\n  Large · Oat milk · 3 shots · Vanilla syrup, Extra hot\n  Note: half sweet');
    expect(text).not.toContain('croissant');
    expect(text).toContain('Ask for #42, Maud Gallant, where the drinks are handed out.');
    expect(text).toContain('because you left your address for the receipt');
  });

  it('counts the same drink twice as one line of two', () => {
    const { text, html } = readyEmail(order({ lines: [latte, { ...latte, id: 5 }] }), 'Harbour & Hearth Coffee');
    expect(text).toContain('2 × Latte');
    expect(text).not.toContain('1 × Latte');
    expect(html).toContain('<strong>2 × Latte</strong>');
  });

  it('escapes what people typed in the HTML and keeps it as written in the text', () => {
    const { html, text, subject } = readyEmail(
      order({ customerName: '<b>Al</b> & co', lines: [{ ...latte, note: '<i>hot</i>' }] }),
      'Tom "Quote" <Café>',
      'en-GB',
    );
    expect(html).not.toMatch(/<b>|<i>|<Café>/);
    expect(html).toContain('is ready, &#60;b&#62;Al&#60;/b&#62;!');
    expect(html).toContain('&#60;b&#62;Al&#60;/b&#62; &#38; co');
    expect(html).toContain('Note: &#60;i&#62;hot&#60;/i&#62;');
    expect(html).toContain('Tom &#34;Quote&#34; &#60;Café&#62;');
    expect(html).toContain('lang="en-GB"');
    expect(text).toContain('is ready, <b>Al</b>!');
    expect(subject).toBe('Your order #42 is ready at Tom "Quote" <Café>');
  });
});
