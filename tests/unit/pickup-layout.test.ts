// The Pickup wall's columns: every name shown or counted, an empty half's room given away.
// Hand-worked; no outside source (Jugline's own layout rule).
import { describe, expect, it } from 'vitest';
import { pickupLayout } from '@/domain/pickup-layout';

describe('pickupLayout', () => {
  it('gives the room of an empty Ready half to Being made (16 names, 4 columns of 6 rows)', () => {
    // hand-worked: Ready keeps 1 column for its heading; 3 × 6 = 18 places ≥ 16 names
    expect(pickupLayout(16, 0, { columns: 4, rows: 6 })).toEqual({ making: { columns: 3, shown: 16, more: 0 }, ready: { columns: 1, shown: 0, more: 0 } });
  });

  it('fits 16 being made and 6 ready on a wall of 4 columns of 6 rows', () => {
    // hand-worked: 16 need 3 columns (18 places), 6 need 1
    expect(pickupLayout(16, 6, { columns: 4, rows: 6 })).toEqual({ making: { columns: 3, shown: 16, more: 0 }, ready: { columns: 1, shown: 6, more: 0 } });
  });

  it('counts what it can’t show: "+n more" takes the last place', () => {
    // hand-worked: 40 in 3 × 6 = 18 places → 17 names and "+23 more"; 6 ready in 1 × 6 → all shown
    const l = pickupLayout(40, 6, { columns: 4, rows: 6 });
    expect(l.making).toEqual({ columns: 3, shown: 17, more: 23 });
    expect(l.making.shown + l.making.more).toBe(40);
    expect(l.ready).toEqual({ columns: 1, shown: 6, more: 0 });
  });

  it('shares columns by need, keeps one for each half, and spare room goes to the half with more names', () => {
    // hand-worked: 3 need 1 column of 6, 30 need 5; 4 columns → Ready 1 (its 3 fit), Making 3
    expect(pickupLayout(3, 30, { columns: 4, rows: 6 }).ready.columns).toBe(3);
    // both fit in 1 column each; the 2 spare go to the half with more names
    expect(pickupLayout(5, 2, { columns: 4, rows: 6 })).toEqual({ making: { columns: 3, shown: 5, more: 0 }, ready: { columns: 1, shown: 2, more: 0 } });
  });

  it('never shows more than fits, even with 1 row', () => {
    // hand-worked: 2 columns × 1 row; 5 names → 0 shown + "+5 more" in a 1-place half
    expect(pickupLayout(5, 0, { columns: 2, rows: 1 }).making).toEqual({ columns: 1, shown: 0, more: 5 });
  });
});
