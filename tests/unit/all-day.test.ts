// The Bar's all-day count and the arrivals its new-ticket sound rings for.
import { describe, expect, it } from 'vitest';
import { allDayCounts, arrivals } from '@/domain/all-day';

const drink = (itemName: string, status: 'queued' | 'making' | 'done' = 'queued') => ({ itemName, status });

describe('allDayCounts', () => {
  it('counts every drink not yet bumped by its name, most first, ties by name', () => {
    // worked by hand: 3 flat whites (one making), 2 lattes and 2 long blacks waiting, a bumped latte left out
    const counts = allDayCounts([
      drink('Flat white'),
      drink('Latte'),
      drink('Long black'),
      drink('Flat white', 'making'),
      drink('Latte', 'done'),
      drink('Long black'),
      drink('Latte'),
      drink('Flat white'),
    ]);
    expect(counts).toEqual([
      { itemName: 'Flat white', count: 3 },
      { itemName: 'Latte', count: 2 },
      { itemName: 'Long black', count: 2 },
    ]);
  });

  it('is empty when everything is bumped', () => {
    expect(allDayCounts([drink('Latte', 'done')])).toEqual([]);
    expect(allDayCounts([])).toEqual([]);
  });
});

describe('arrivals', () => {
  it('announces nothing on the first look, then each new ticket once', () => {
    const first = arrivals(null, [1, 2]);
    expect(first.fresh).toEqual([]);
    const second = arrivals(first.seen, [1, 2, 3]);
    expect(second.fresh).toEqual([3]);
    expect(arrivals(second.seen, [2, 3, 4, 5]).fresh).toEqual([4, 5]);
  });

  it('a ticket that left and came back (a recall) is no arrival', () => {
    const a = arrivals(arrivals(null, [7]).seen, []);
    expect(arrivals(a.seen, [7]).fresh).toEqual([]);
  });
});
