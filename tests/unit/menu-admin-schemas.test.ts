// The menu editor's rules, as the form and the route both apply them.
import { describe, expect, it } from 'vitest';
import { formPathOf, itemBody, itemForm, milkBody, type ItemFormValues } from '@/domain/menu-admin-schemas';

const size = (over = {}) => ({ name: '12 oz', volumeMl: 355, priceCents: 560, shots: 2, doseDg: 180, yieldDg: 360, milkMl: 240, isDefault: true, ...over });
const latte = (over = {}) => ({
  categoryId: 1,
  name: 'Ember Spice Latte',
  station: 'bar',
  takesMilk: true,
  defaultMilkId: 3,
  texture: 'silky',
  sizes: [size()],
  ...over,
});
const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) => (r.error?.issues ?? []).map((i) => i.path.join('.'));

describe('itemBody', () => {
  it('accepts a milk drink with its recipe and fills the defaults', () => {
    const r = itemBody.safeParse(latte());
    expect(r.success).toBe(true);
    expect(r.data).toMatchObject({ ingredients: [], extraGroupIds: [], priceCents: null, sizes: [{ cup: null }] });
  });
  it('keeps the ranges of the brief: price 0–100000 ¢, shots 0–4, dose 5–30 g, yield 0–120 g, milk 0–600 ml', () => {
    // the bounds themselves are allowed
    expect(itemBody.safeParse(latte({ sizes: [size({ priceCents: 100_000, shots: 4, doseDg: 300, yieldDg: 1200, milkMl: 600 })] })).success).toBe(true);
    expect(itemBody.safeParse(latte({ sizes: [size({ priceCents: 0, doseDg: 50, yieldDg: 0, milkMl: 1 })] })).success).toBe(true);
    // one past each bound is not
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ priceCents: 100_001 })] })))).toEqual(['sizes.0.priceCents']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ shots: 5 })] })))).toEqual(['sizes.0.shots']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ doseDg: 49 })] })))).toEqual(['sizes.0.doseDg']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ doseDg: 301 })] })))).toEqual(['sizes.0.doseDg']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ yieldDg: 1201 })] })))).toEqual(['sizes.0.yieldDg']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ milkMl: 601 })] })))).toEqual(['sizes.0.milkMl']);
  });
  it('wants exactly one default size, and milk on every size of a milk drink', () => {
    expect(paths(itemBody.safeParse(latte({ sizes: [size(), size({ name: '16 oz' })] })))).toEqual(['sizes']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size({ isDefault: false })] })))).toEqual(['sizes']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size(), size({ name: '16 oz', milkMl: 0, isDefault: false })] })))).toEqual(['sizes.1.milkMl']);
    expect(paths(itemBody.safeParse(latte({ sizes: [size(), size({ name: '12 OZ', isDefault: false })] })))).toEqual(['sizes.1.name']);
  });
  it('trims names and wants 1–60 characters', () => {
    expect(itemBody.parse(latte({ name: '  Ember Spice Latte  ' })).name).toBe('Ember Spice Latte');
    expect(paths(itemBody.safeParse(latte({ name: '   ' })))).toEqual(['name']);
    expect(itemBody.safeParse(latte({ name: 'x'.repeat(60) })).success).toBe(true);
    expect(paths(itemBody.safeParse(latte({ name: 'x'.repeat(61) })))).toEqual(['name']);
  });
});

describe('ingredients in a body', () => {
  it("takes only ingredients Jugline knows, once each, and stores them in the editor's order", () => {
    expect(milkBody.parse({ name: 'Oat', code: 'OA', upchargeCents: 70, ingredients: ['oats'] }).ingredients).toEqual(['oats']);
    // the allergens are worked out, never sent: a list tag is no ingredient
    expect(paths(milkBody.safeParse({ name: 'Oat', code: 'OA', upchargeCents: 70, ingredients: ['cereals containing gluten'] }))).toEqual(['ingredients.0']);
    expect(paths(milkBody.safeParse({ name: 'Oat', code: 'OA', upchargeCents: 70, allergens: ['milk'] }))).toEqual(['']);
    expect(paths(itemBody.safeParse(latte({ ingredients: ['egg', 'egg'] })))).toEqual(['ingredients']);
    expect(itemBody.parse(latte({ ingredients: ['egg', 'wheat', "cow's milk"] })).ingredients).toEqual(["cow's milk", 'egg', 'wheat']);
  });
});

describe('milkBody', () => {
  it('takes a two-letter lane code in capitals', () => {
    expect(milkBody.parse({ name: 'Oat', code: ' oa ', upchargeCents: 70 }).code).toBe('OA');
    expect(milkBody.safeParse({ name: 'Oat', code: 'O', upchargeCents: 70 }).success).toBe(false);
    expect(milkBody.safeParse({ name: 'Oat', code: 'Ö1', upchargeCents: 70 }).success).toBe(false);
  });
});

const formSize = (over = {}) => ({
  name: '12 oz',
  volumeMl: '355',
  cup: '12 oz cup',
  price: '5.60',
  shots: '2',
  doseG: '18',
  yieldG: '36',
  milkMl: '240',
  isDefault: true,
  ...over,
});
const form = (over: Partial<ItemFormValues> = {}): ItemFormValues => ({
  categoryId: '1',
  name: 'Ember Spice Latte',
  station: 'bar',
  price: '',
  takesMilk: true,
  defaultMilkId: '3',
  texture: 'silky',
  ingredients: [],
  extraGroupIds: [2],
  sizes: [formSize(), formSize({ name: '16 oz', volumeMl: '473', cup: '16 oz cup', price: '6.20', milkMl: '320', isDefault: false })],
  ...over,
});

describe('itemForm', () => {
  it('turns grams and prices typed as text into the body the route takes', () => {
    const body = itemForm.parse(form());
    expect(itemBody.safeParse(body).success).toBe(true);
    // 18 g → 180 tenths, 36 g → 360; $5.60 → 560 cents (hand-checked)
    expect(body.sizes[0]).toEqual({
      name: '12 oz',
      volumeMl: 355,
      cup: '12 oz cup',
      priceCents: 560,
      shots: 2,
      doseDg: 180,
      yieldDg: 360,
      milkMl: 240,
      isDefault: true,
    });
    expect(body.sizes[1]).toMatchObject({ priceCents: 620, doseDg: 180, yieldDg: 360, milkMl: 320, isDefault: false });
    expect(body).toMatchObject({ categoryId: 1, defaultMilkId: 3, texture: 'silky', priceCents: null, extraGroupIds: [2] });
  });
  it('names the form field, in grams, when a rule fails', () => {
    expect(paths(itemForm.safeParse(form({ sizes: [formSize({ doseG: '4.5' })] })))).toEqual(['sizes.0.doseG']);
    expect(paths(itemForm.safeParse(form({ sizes: [formSize({ doseG: 'lots' })] })))).toEqual(['sizes.0.doseG']);
    expect(paths(itemForm.safeParse(form({ sizes: [formSize({ price: '5.605' })] })))).toEqual(['sizes.0.price']);
    expect(paths(itemForm.safeParse(form({ sizes: [formSize({ milkMl: '' })] })))).toEqual(['sizes.0.milkMl']);
  });
  it('drops milk, texture and recipe grams that do not apply', () => {
    const body = itemForm.parse(
      form({ takesMilk: false, defaultMilkId: '3', texture: 'silky', sizes: [formSize({ shots: '0', doseG: '18', yieldG: '36', milkMl: '240' })] }),
    );
    expect(body).toMatchObject({ defaultMilkId: null, texture: null, sizes: [{ shots: 0, doseDg: 0, yieldDg: 0, milkMl: 0 }] });
    expect(itemBody.safeParse(body).success).toBe(true);
  });
  it('an item without sizes needs its price', () => {
    expect(paths(itemForm.safeParse(form({ takesMilk: false, sizes: [], price: '' })))).toEqual(['price']);
    expect(itemForm.parse(form({ takesMilk: false, station: 'counter', sizes: [], price: '4.25' })).priceCents).toBe(425);
  });
  it('maps the route’s field names onto the form’s', () => {
    expect(formPathOf(['sizes', 0, 'doseDg'])).toEqual(['sizes', 0, 'doseG']);
    expect(formPathOf(['priceCents'])).toEqual(['price']);
    expect(formPathOf(['sizes', 1, 'milkMl'])).toEqual(['sizes', 1, 'milkMl']);
  });
});
