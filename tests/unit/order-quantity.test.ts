// Many of one drink: identical lines merge into one with a quantity, the server expands a line
// into one drink per cup, and the receipt groups them back ("3 × Long black"). Also the words
// the Counter uses for counts and for a field that is too long.
import { describe, expect, it } from 'vitest';
import { addLine, cupsOf, expandByQuantity, groupOrderLines, orderCountLabel, MAX_CUPS, MAX_QUANTITY } from '@/domain/order-quantity';
import { plural } from '@/domain/plural';
import { createOrderBody } from '@/domain/schemas';
import type { MenuItemView, MenuView, OrderLineView } from '@/domain/types';
import { menuItem } from '../support/menu-items';

// An invented café; none of these numbers come from the demo café.
const item = (over: Partial<MenuItemView> & Pick<MenuItemView, 'id' | 'name'>) => menuItem(over, [7]);
const menu = {
  location: { currency: 'USD', taxMode: 'exclusive', taxRateMilliPct: 0, extraShotCents: 80 },
  categories: [{ id: 1, name: 'Drinks' }],
  items: [
    item({ id: 1, name: 'Short black', priceCents: 350, shots: 2 }),
    item({ id: 2, name: 'Cortado', priceCents: 420, shots: 2, takesMilk: true, defaultMilkId: 11, texture: 'flat' }),
    item({ id: 3, name: 'Scone', station: 'counter', priceCents: 300 }),
  ],
  milks: [
    { id: 11, name: 'Dairy', code: 'DA', upchargeCents: 0, allergens: ['milk'] },
    { id: 12, name: 'Oat', code: 'OA', upchargeCents: 60, allergens: [] },
  ],
  extraGroups: [{ id: 7, name: 'Syrup', selection: 'multi', required: false }],
  extras: [
    { id: 21, groupId: 7, groupName: 'Syrup', name: 'Maple', priceCents: 50, allergens: [] },
    { id: 22, groupId: 7, groupName: 'Syrup', name: 'Honey', priceCents: 50, allergens: [] },
  ],
} as unknown as MenuView;

describe('addLine', () => {
  it('adds to the quantity of an identical line, however its defaults were written', () => {
    let items = addLine(menu, [], { menuItemId: 2, milkId: 11, extraIds: [] });
    items = addLine(menu, items, { menuItemId: 2 }); // the same drink, defaults left out
    items = addLine(menu, items, { menuItemId: 2, milkId: 11, shots: 2, extraIds: [] });
    expect(items).toEqual([{ menuItemId: 2, milkId: 11, extraIds: [], quantity: 3 }]);
  });

  it('keeps a line of its own for another milk, extra, shot count or note', () => {
    let items = addLine(menu, [], { menuItemId: 2 });
    items = addLine(menu, items, { menuItemId: 2, milkId: 12 });
    items = addLine(menu, items, { menuItemId: 2, extraIds: [21] });
    items = addLine(menu, items, { menuItemId: 2, shots: 3 });
    items = addLine(menu, items, { menuItemId: 2, note: 'extra hot' });
    expect(items).toHaveLength(5);
    expect(items.every((l) => (l.quantity ?? 1) === 1)).toBe(true);
  });

  it('treats extras in another order as the same drink', () => {
    const items = addLine(menu, addLine(menu, [], { menuItemId: 1, extraIds: [21, 22] }), { menuItemId: 1, extraIds: [22, 21] });
    expect(items).toHaveLength(1);
    expect(items[0].quantity).toBe(2);
  });

  it('stops at the most one line may hold', () => {
    const items = addLine(menu, [{ menuItemId: 1, quantity: MAX_QUANTITY }], { menuItemId: 1 });
    expect(items[0].quantity).toBe(MAX_QUANTITY);
  });
});

describe('expandByQuantity and cupsOf', () => {
  it('gives one entry per cup, in line order', () => {
    const lines = [{ menuItemId: 1, quantity: 3 }, { menuItemId: 3 }];
    expect(expandByQuantity(lines, (l) => l.menuItemId)).toEqual([1, 1, 1, 3]);
    expect(cupsOf(lines)).toBe(4);
  });
});

describe('groupOrderLines', () => {
  const line = (id: number, over: Partial<OrderLineView> = {}): OrderLineView => ({
    id,
    menuItemId: 1,
    itemName: 'Short black',
    station: 'bar',
    sizeName: null,
    milkName: null,
    shots: 2,
    extras: [],
    note: null,
    priceCents: 350,
    status: 'done',
    refundedAt: null,
    remake: null,
    remadeAs: null,
    ...over,
  });
  it('groups identical stored drinks back into "3 × Short black" with the line total', () => {
    const groups = groupOrderLines([line(1), line(2), line(3), line(4, { note: 'in a glass' }), line(5)]);
    expect(groups.map((g) => [g.quantity, g.line.id, g.totalCents])).toEqual([
      [4, 1, 1400], // 4 × 350, worked by hand
      [1, 4, 350],
    ]);
  });
});

describe('counts in words', () => {
  it('says "1 drink" and "2 drinks" (English plural rules through Intl.PluralRules)', () => {
    expect(plural(0, 'drink')).toBe('0 drinks');
    expect(plural(1, 'drink')).toBe('1 drink');
    expect(plural(2, 'drink')).toBe('2 drinks');
    expect(plural(1, 'order')).toBe('1 order');
  });
  it('counts drinks and other items apart, by cup', () => {
    expect(orderCountLabel(menu, [{ menuItemId: 1, quantity: 3 }])).toBe('3 drinks');
    expect(orderCountLabel(menu, [{ menuItemId: 1 }, { menuItemId: 3 }])).toBe('1 drink, 1 item');
    expect(orderCountLabel(menu, [{ menuItemId: 3, quantity: 2 }])).toBe('2 items');
    expect(orderCountLabel(menu, [])).toBe('empty');
  });
});

describe('createOrderBody: quantity and the words for a refusal', () => {
  const body = (over: Record<string, unknown> = {}) => ({
    clientOrderId: '6d1f1c53-1d7e-4bb0-9d0b-4d9f6b0f5a11',
    customerName: 'Ada',
    items: [{ menuItemId: 1 }],
    payment: { method: 'cash', tenderedCents: 500 },
    ...over,
  });
  const issues = (over: Record<string, unknown>) => {
    const r = createOrderBody.safeParse(body(over));
    return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
  };

  it('takes a quantity from 1 to the most one line may hold', () => {
    expect(issues({ items: [{ menuItemId: 1, quantity: 1 }] })).toEqual([]);
    expect(issues({ items: [{ menuItemId: 1, quantity: MAX_QUANTITY }] })).toEqual([]);
    expect(issues({ items: [{ menuItemId: 1, quantity: 0 }] })).toEqual([{ path: 'items.0.quantity', message: 'A line holds at least 1' }]);
    expect(issues({ items: [{ menuItemId: 1, quantity: MAX_QUANTITY + 1 }] })).toEqual([
      { path: 'items.0.quantity', message: `A line holds at most ${MAX_QUANTITY}` },
    ]);
    expect(issues({ items: [{ menuItemId: 1, quantity: 1.5 }] })).toHaveLength(1);
  });

  it(`refuses an order of more than ${MAX_CUPS} cups in all`, () => {
    const items = Array.from({ length: 3 }, () => ({ menuItemId: 1, quantity: 40 }));
    expect(issues({ items })).toEqual([{ path: 'items', message: `An order holds at most ${MAX_CUPS} drinks and items` }]);
  });

  it('names the field and its limit in a sentence, never the validator’s own words', () => {
    const found = issues({
      customerName: 'x'.repeat(41),
      allergyNote: 'x'.repeat(201),
      allergens: ['x'.repeat(41)],
      customerEmail: `${'x'.repeat(250)}@example.test`,
      items: [{ menuItemId: 1, note: 'x'.repeat(141), extraIds: Array.from({ length: 13 }, (_, i) => i + 1) }],
    });
    expect(found).toEqual(
      expect.arrayContaining([
        { path: 'customerName', message: 'A name for the cup is at most 40 characters' },
        { path: 'allergyNote', message: 'An allergy note is at most 200 characters' },
        { path: 'items.0.note', message: 'A note for the bar is at most 140 characters' },
      ]),
    );
    for (const f of found) expect(f.message).not.toMatch(/expected|Too big|Too small|Invalid/);
    expect(issues({ customerName: '' })).toEqual([{ path: 'customerName', message: 'Enter the customer name' }]);
    expect(issues({ items: Array.from({ length: 41 }, () => ({ menuItemId: 1 })) })[0].message).toBe('An order holds at most 40 lines');
  });
});
