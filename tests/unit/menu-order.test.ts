// Moving a menu row one place among its siblings.
import { describe, expect, it } from 'vitest';
import { moveAmong } from '@/domain/menu-order';

describe('moveAmong', () => {
  it('swaps a row with its neighbour (hand-worked)', () => {
    expect(moveAmong([10, 20, 30], 20, 'up')).toEqual([20, 10, 30]);
    expect(moveAmong([10, 20, 30], 20, 'down')).toEqual([10, 30, 20]);
  });
  it('cannot move the first up, the last down, or a row that is not there', () => {
    expect(moveAmong([10, 20, 30], 10, 'up')).toBeNull();
    expect(moveAmong([10, 20, 30], 30, 'down')).toBeNull();
    expect(moveAmong([10, 20, 30], 40, 'up')).toBeNull();
    expect(moveAmong([], 1, 'down')).toBeNull();
  });
  it('leaves the list it was given as it was', () => {
    const ids = [1, 2, 3];
    moveAmong(ids, 3, 'up');
    expect(ids).toEqual([1, 2, 3]);
  });
  it('up then down is where it started', () => {
    const ids = [4, 8, 15, 16, 23, 42];
    for (const id of ids.slice(1)) expect(moveAmong(moveAmong(ids, id, 'up')!, id, 'down')).toEqual(ids);
  });
});
