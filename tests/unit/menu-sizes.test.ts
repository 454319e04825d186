// An item form's list of sizes against the sizes stored: update, add, bring back, retire.
import { describe, expect, it } from 'vitest';
import { planSizeChanges } from '@/domain/menu-sizes';

const stored = [
  { id: 1, retired: false },
  { id: 2, retired: false },
  { id: 3, retired: true },
];

describe('planSizeChanges', () => {
  it('keeps listed sizes in their new places and adds the new ones', () => {
    expect(planSizeChanges(stored, [{ id: 2 }, {}, { id: 1 }])).toEqual({
      unknown: [],
      keep: [
        { id: 2, sort: 0, restore: false },
        { id: 1, sort: 2, restore: false },
      ],
      insert: [1],
      retire: [],
    });
  });
  it('retires the sizes in use the list leaves out, never the already retired', () => {
    expect(planSizeChanges(stored, [{ id: 1 }]).retire).toEqual([2]);
    expect(planSizeChanges(stored, []).retire).toEqual([1, 2]);
  });
  it('brings back a retired size that is listed again', () => {
    expect(planSizeChanges(stored, [{ id: 3 }, { id: 1 }, { id: 2 }]).keep[0]).toEqual({ id: 3, sort: 0, restore: true });
  });
  it("names ids the item doesn't have", () => {
    expect(planSizeChanges(stored, [{ id: 1 }, { id: 99 }]).unknown).toEqual([99]);
  });
});
