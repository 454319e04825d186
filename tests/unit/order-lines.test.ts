import { describe, it, expect } from 'vitest';
import { resolveLine, type LineResult, type ResolvedLine } from '@/domain/order-lines';
import type { MenuItemView, MenuView } from '@/domain/types';
import { menuItem } from '../support/menu-items';

// An invented "Test Café"; none of these numbers come from the demo café.
const EXTRA_SHOT = 95;
const DAIRY = 1; // no upcharge
const PEA = 2; // +65
const HEMP = 3; // +45
const LATTE = 10;
const GIBRALTAR = 11; // milk drink, one size, no default milk
const POUR_OVER = 12; // sized, no milk
const SCONE = 13; // counter item, no sizes
const AFFOGATO = 14; // 86'd
const SYRUPS = 41;
const TOPPINGS = 42;
const MAPLE = 31; // +55
const CINNAMON = 32; // +15

const item = (over: Partial<MenuItemView> & Pick<MenuItemView, 'id' | 'name'>) => menuItem({ extraGroupIds: [SYRUPS, TOPPINGS], ...over });

function testMenu(): MenuView {
  return {
    location: {
      id: 1,
      name: 'Test Café',
      timeZone: 'UTC',
      currency: 'USD',
      taxMode: 'exclusive',
      taxRateMilliPct: 6500,
      extraShotCents: EXTRA_SHOT,
      waitTargetSeconds: 300,
      pickupTimeoutSeconds: 120,
      allergenList: 'US',
      baristasOnBar: 1,
      receiptFooter: null,
      jugWasteMl: 0,
    },
    categories: [{ id: 1, name: 'Drinks' }],
    items: [
      item({
        id: LATTE,
        name: 'Test latte',
        shots: 2,
        takesMilk: true,
        defaultMilkId: DAIRY,
        texture: 'silky',
        // The default is deliberately not the first size.
        sizes: [
          { id: 101, name: 'Petite', volumeMl: 230, priceCents: 300, shots: 1, milkMl: 150, doseDg: 90, yieldDg: 180, isDefault: false },
          { id: 102, name: 'Standard', volumeMl: 340, priceCents: 410, shots: 2, milkMl: 240, doseDg: 180, yieldDg: 360, isDefault: true },
          { id: 103, name: 'Jumbo', volumeMl: 450, priceCents: 515, shots: 3, milkMl: 320, doseDg: 270, yieldDg: 540, isDefault: false },
        ],
      }),
      item({ id: GIBRALTAR, name: 'Gibraltar', priceCents: 375, shots: 2, takesMilk: true, texture: 'flat' }),
      item({
        id: POUR_OVER,
        name: 'Pour-over',
        sizes: [
          { id: 121, name: 'Cup', volumeMl: 250, priceCents: 420, shots: 0, milkMl: 0, doseDg: 0, yieldDg: 0, isDefault: false },
          { id: 122, name: 'Carafe', volumeMl: 500, priceCents: 760, shots: 0, milkMl: 0, doseDg: 0, yieldDg: 0, isDefault: false },
        ],
      }),
      item({ id: SCONE, name: 'Cheese scone', station: 'counter', priceCents: 330 }),
      item({ id: AFFOGATO, name: 'Affogato', priceCents: 480, shots: 1, available: false }),
    ],
    milks: [
      { id: DAIRY, name: 'Dairy', code: 'DA', upchargeCents: 0, allergens: ['milk'] },
      { id: PEA, name: 'Pea', code: 'PE', upchargeCents: 65, allergens: [] },
      { id: HEMP, name: 'Hemp', code: 'HE', upchargeCents: 45, allergens: [] },
    ],
    extraGroups: [
      { id: SYRUPS, name: 'Syrup', selection: 'multi', required: false },
      { id: TOPPINGS, name: 'Topping', selection: 'multi', required: false },
    ],
    extras: [
      { id: MAPLE, groupId: SYRUPS, groupName: 'Syrup', name: 'Maple', priceCents: 55, allergens: [] },
      { id: CINNAMON, groupId: TOPPINGS, groupName: 'Topping', name: 'Cinnamon', priceCents: 15, allergens: [] },
    ],
  };
}

function ok(result: LineResult): ResolvedLine {
  if (!result.ok) throw new Error(`expected a line, got ${JSON.stringify(result.problem)}`);
  return result.line;
}

function problem(result: LineResult) {
  if (result.ok) throw new Error('expected a problem, got a line');
  return result.problem;
}

describe('resolveLine: sizes', () => {
  it('picks the size marked isDefault when none is given', () => {
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE }));
    expect(line.size?.id).toBe(102);
    // Price from the test menu: Standard 410 + Dairy 0
    expect(line.priceCents).toBe(410);
    expect(line.shots).toBe(2);
    expect(line.milkMl).toBe(240);
  });

  it('falls back to the first size when none is marked default', () => {
    const line = ok(resolveLine(testMenu(), { menuItemId: POUR_OVER }));
    expect(line.size?.id).toBe(121);
    expect(line.priceCents).toBe(420);
  });

  it('uses the size asked for', () => {
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, sizeId: 101 }));
    expect(line.size?.name).toBe('Petite');
    expect(line.priceCents).toBe(300);
  });

  it('rejects an unknown size', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: LATTE, sizeId: 999 }));
    expect(p).toMatchObject({ field: 'sizeId', kind: 'invalid' });
  });

  it('rejects a size for an item that has none', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: SCONE, sizeId: 101 }));
    expect(p).toMatchObject({ field: 'sizeId', kind: 'invalid' });
  });

  it('prices an unsized counter item from the item itself', () => {
    const line = ok(resolveLine(testMenu(), { menuItemId: SCONE }));
    expect(line.size).toBeNull();
    expect(line.milk).toBeNull();
    expect(line.station).toBe('counter');
    expect(line.priceCents).toBe(330);
    expect(line.milkMl).toBe(0);
  });
});

describe('resolveLine: items', () => {
  it('rejects an unknown item', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: 4040 }));
    expect(p).toMatchObject({ field: 'menuItemId', kind: 'invalid' });
  });

  it("reports an 86'd item as unavailable, not invalid", () => {
    // Common practice: "86'd" means sold out for now; the counter shows it differently from a bad request
    const p = problem(resolveLine(testMenu(), { menuItemId: AFFOGATO }));
    expect(p).toMatchObject({ field: 'menuItemId', kind: 'unavailable' });
  });
});

describe('resolveLine: milk', () => {
  it("uses the item's default milk when none is given", () => {
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE }));
    expect(line.milk?.id).toBe(DAIRY);
  });

  it('adds the chosen milk upcharge', () => {
    // Common practice: plant milks carry an upcharge. Standard 410 + Pea 65 = 475
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, milkId: PEA }));
    expect(line.milk?.code).toBe('PE');
    expect(line.priceCents).toBe(475);
  });

  it('charges nothing extra for the milk a drink is made with by default', () => {
    // Common practice: an alternative-milk charge is for a swap. A drink whose own milk is Pea is
    // sold at its menu price (410); swapping it to Hemp costs the Hemp charge (410 + 45 = 455).
    const menu = testMenu();
    menu.items = menu.items.map((i) => (i.id === LATTE ? { ...i, defaultMilkId: PEA } : i));
    expect(ok(resolveLine(menu, { menuItemId: LATTE })).priceCents).toBe(410);
    expect(ok(resolveLine(menu, { menuItemId: LATTE, milkId: PEA })).priceCents).toBe(410);
    expect(ok(resolveLine(menu, { menuItemId: LATTE, milkId: HEMP })).priceCents).toBe(455);
  });

  it('asks for a milk when the item has no default and none is given', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: GIBRALTAR }));
    expect(p).toMatchObject({ field: 'milkId', kind: 'invalid' });
  });

  it('rejects an unknown milk', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: LATTE, milkId: 77 }));
    expect(p.field).toBe('milkId');
  });

  it('rejects a milk for an item that takes none', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: POUR_OVER, milkId: DAIRY }));
    expect(p).toMatchObject({ field: 'milkId', kind: 'invalid' });
    const q = problem(resolveLine(testMenu(), { menuItemId: SCONE, milkId: HEMP }));
    expect(q.field).toBe('milkId');
  });
});

describe('resolveLine: shots', () => {
  it('charges each extra shot on top of the recipe at location.extraShotCents', () => {
    // Common practice: an extra espresso shot is charged on top of the recipe's shots.
    // Standard has 2 shots; 4 asked → 2 extra × 95 = 190; 410 + 190 = 600
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, shots: 4 }));
    expect(line.shots).toBe(4);
    expect(line.priceCents).toBe(600);
  });

  it('counts extras against the chosen size, not the item', () => {
    // Jumbo's recipe is 3 shots; 4 asked → 1 extra: 515 + 95 = 610
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, sizeId: 103, shots: 4 }));
    expect(line.priceCents).toBe(610);
  });

  it('gives no discount for fewer shots than the recipe', () => {
    // Common practice: a weaker drink costs the menu price. Standard (2 shots) asked with 1 → still 410
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, shots: 1 }));
    expect(line.shots).toBe(1);
    expect(line.priceCents).toBe(410);
    const none = ok(resolveLine(testMenu(), { menuItemId: LATTE, shots: 0 }));
    expect(none.priceCents).toBe(410);
  });
});

describe('resolveLine: extras and the full price', () => {
  it('rejects an extra listed twice', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: LATTE, extraIds: [MAPLE, MAPLE] }));
    expect(p).toMatchObject({ field: 'extraIds', kind: 'invalid' });
  });

  it('rejects an unknown extra', () => {
    const p = problem(resolveLine(testMenu(), { menuItemId: LATTE, extraIds: [999] }));
    expect(p.field).toBe('extraIds');
  });

  it('prices a line as size + milk upcharge + extra shots + extras', () => {
    // Hand-worked from the test menu: Jumbo 515 + Hemp 45 + (5 − 3) × 95 + Maple 55 + Cinnamon 15 = 820
    const line = ok(resolveLine(testMenu(), { menuItemId: LATTE, sizeId: 103, milkId: HEMP, shots: 5, extraIds: [MAPLE, CINNAMON] }));
    expect(line.priceCents).toBe(820);
    expect(line.extras.map((m) => m.name)).toEqual(['Maple', 'Cinnamon']);
    expect(line.texture).toBe('silky');
    expect(line.milkMl).toBe(320);
  });

  it('keeps a note and turns an empty one into null', () => {
    expect(ok(resolveLine(testMenu(), { menuItemId: LATTE, note: 'half foam' })).note).toBe('half foam');
    expect(ok(resolveLine(testMenu(), { menuItemId: LATTE, note: '' })).note).toBeNull();
  });
});

describe('resolveLine: extras by group', () => {
  it('refuses an extra from a group the item does not offer', () => {
    const menu = testMenu();
    menu.items = menu.items.map((i) => ({ ...i, extraGroupIds: [SYRUPS] }));
    const r = resolveLine(menu, { menuItemId: menu.items[0].id, extraIds: [CINNAMON] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problem).toMatchObject({ field: 'extraIds', kind: 'invalid' });
  });

  it('allows one choice in a single-choice group and insists on a required one', () => {
    const menu = testMenu();
    const MINT = 33;
    menu.extraGroups = [
      { id: SYRUPS, name: 'Syrup', selection: 'single', required: true },
      { id: TOPPINGS, name: 'Topping', selection: 'multi', required: false },
    ];
    menu.extras.push({ id: MINT, groupId: SYRUPS, groupName: 'Syrup', name: 'Mint', priceCents: 55, allergens: [] });
    const itemId = menu.items[0].id;
    const two = resolveLine(menu, { menuItemId: itemId, extraIds: [MAPLE, MINT] });
    expect(two.ok).toBe(false);
    if (!two.ok) expect(two.problem.message).toMatch(/one syrup/i);
    const none = resolveLine(menu, { menuItemId: itemId, extraIds: [CINNAMON] });
    expect(none.ok).toBe(false);
    if (!none.ok) expect(none.problem.message).toMatch(/choose a syrup/i);
    expect(resolveLine(menu, { menuItemId: itemId, extraIds: [MINT, CINNAMON] }).ok).toBe(true);
  });
});

describe('resolveLine: drink options', () => {
  const FOAM = 43;
  const [DRY, KIDS] = [33, 34];
  function optionsMenu(growth?: { flat: number; silky: number; foamy: number }): MenuView {
    const menu = testMenu();
    return {
      ...menu,
      location: { ...menu.location, ...(growth ? { milkGrowthPct: growth } : {}) },
      items: menu.items.map((i) => (i.id === LATTE ? { ...i, extraGroupIds: [...i.extraGroupIds, FOAM] } : i)),
      extraGroups: [...menu.extraGroups, { id: FOAM, name: 'How it’s made', selection: 'multi', required: false }],
      extras: [
        ...menu.extras,
        { id: DRY, groupId: FOAM, groupName: 'How it’s made', name: 'Dry', priceCents: 0, allergens: [], barEffect: 'dry' },
        { id: KIDS, groupId: FOAM, groupName: 'How it’s made', name: 'Kids’ temp', priceCents: 0, allergens: [], barEffect: 'kids_temp' },
      ],
    };
  }

  it('a dry latte is stored foamy with less milk, priced as a latte', () => {
    const plain = ok(resolveLine(optionsMenu(), { menuItemId: LATTE }));
    const dry = ok(resolveLine(optionsMenu(), { menuItemId: LATTE, extraIds: [DRY] }));
    expect(plain).toMatchObject({ texture: 'silky', milkMl: 240, kidsTemp: false });
    // 240 × 1.25 / 1.75 = 171.4, × 0.8 = 137.1 → 137 ml (default growth 15 / 25 / 75 %)
    expect(dry).toMatchObject({ texture: 'foamy', milkMl: 137, kidsTemp: false, priceCents: plain.priceCents });
    expect(dry.extras.map((e) => e.name)).toEqual(['Dry']);
  });

  it('uses the café’s milk growth, and marks kids’ temperature', () => {
    // growth 10 / 30 / 60: 240 × 1.3 / 1.6 = 195, × 0.8 = 156 ml
    expect(ok(resolveLine(optionsMenu({ flat: 10, silky: 30, foamy: 60 }), { menuItemId: LATTE, extraIds: [DRY] })).milkMl).toBe(156);
    expect(ok(resolveLine(optionsMenu(), { menuItemId: LATTE, extraIds: [KIDS] }))).toMatchObject({ texture: 'silky', milkMl: 240, kidsTemp: true });
  });
});
