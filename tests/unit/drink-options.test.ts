// Drink options at the bar: the texture they ask for and the cold milk that still fills the cup.
import { describe, expect, it } from 'vitest';
import { DEFAULT_MILK_GROWTH_PCT, withBarEffects } from '@/domain/drink-options';

describe('withBarEffects', () => {
  it('leaves a drink without effects as it is', () => {
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, [])).toEqual({ texture: 'silky', milkMl: 200, kidsTemp: false });
  });

  it('keeps the cup full when the texture changes: foamier milk grows more, so less goes in cold', () => {
    // worked by hand with growth 15 / 25 / 75 %: a silky 200 ml latte fills 200 × 1.25 = 250 ml of cup;
    // wet (flat, 1.15): 250 / 1.15 = 217.4 → 217 ml; more foam (foamy, 1.75): 250 / 1.75 = 142.9 → 143 ml
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, ['wet'])).toEqual({ texture: 'flat', milkMl: 217, kidsTemp: false });
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, ['more_foam'])).toEqual({ texture: 'foamy', milkMl: 143, kidsTemp: false });
    // a flat white (flat, 160 ml) with more foam goes one step, to silky: 160 × 1.15 / 1.25 = 147.2 → 147
    expect(withBarEffects({ texture: 'flat', milkMl: 160 }, ['more_foam'])).toEqual({ texture: 'silky', milkMl: 147, kidsTemp: false });
    // more foam on what is already foamiest stays foamy, same milk
    expect(withBarEffects({ texture: 'foamy', milkMl: 120 }, ['more_foam'])).toEqual({ texture: 'foamy', milkMl: 120, kidsTemp: false });
  });

  it('a dry cappuccino needs more foam and less milk than a cappuccino', () => {
    // a cappuccino is already foamy (120 ml); dry takes 80 % of that: 96 ml
    expect(withBarEffects({ texture: 'foamy', milkMl: 120 }, ['dry'])).toEqual({ texture: 'foamy', milkMl: 96, kidsTemp: false });
    // a dry latte: 200 × 1.25 / 1.75 = 142.86, × 0.8 = 114.3 → 114 ml
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, ['dry'])).toEqual({ texture: 'foamy', milkMl: 114, kidsTemp: false });
  });

  it('uses the café’s own growth figures', () => {
    // growth 10 / 30 / 60 %: silky 200 ml fills 260 ml; wet → 260 / 1.1 = 236.4 → 236
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, ['wet'], { flat: 10, silky: 30, foamy: 60 }).milkMl).toBe(236);
    expect(DEFAULT_MILK_GROWTH_PCT).toEqual({ flat: 15, silky: 25, foamy: 75 });
  });

  it('kids’ temperature changes no milk, only the jug', () => {
    expect(withBarEffects({ texture: 'silky', milkMl: 200 }, ['kids_temp'])).toEqual({ texture: 'silky', milkMl: 200, kidsTemp: true });
    // iced and milkless drinks have nothing to stretch
    expect(withBarEffects({ texture: 'cold', milkMl: 180 }, ['dry'])).toEqual({ texture: 'cold', milkMl: 180, kidsTemp: false });
    expect(withBarEffects({ texture: null, milkMl: 0 }, ['wet', 'kids_temp'])).toEqual({ texture: null, milkMl: 0, kidsTemp: true });
  });
});
