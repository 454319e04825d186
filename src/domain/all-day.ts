// The Bar's "all day" count: how many of each drink are waiting across every open ticket, so a
// barista sees "5 Flat white" at a glance and can grind, cup and pour for them together. A drink
// counts until it is bumped, started or not; it counts by its menu name, since that is what a
// barista sets cups out for (sizes and milks already have their lanes).
import type { DrinkView } from './types';

export interface AllDayCount {
  itemName: string;
  count: number;
}

/** Most first; equal counts by name, so the line doesn't jump about when nothing changed. */
export function allDayCounts(drinks: readonly Pick<DrinkView, 'itemName' | 'status'>[]): AllDayCount[] {
  const counts = new Map<string, number>();
  for (const d of drinks) if (d.status !== 'done') counts.set(d.itemName, (counts.get(d.itemName) ?? 0) + 1);
  return [...counts].map(([itemName, count]) => ({ itemName, count })).sort((a, b) => b.count - a.count || a.itemName.localeCompare(b.itemName, 'en'));
}

/**
 * Tickets that reached the Bar since it last looked: ids in `tickets` not in `seen`. `seen` grows
 * with every ticket ever shown, so a recalled ticket coming back is no arrival. The first look
 * (an empty `seen`, the page just loaded) announces nothing.
 */
export function arrivals(seen: Set<number> | null, ticketIds: readonly number[]): { fresh: number[]; seen: Set<number> } {
  const next = new Set(seen ?? []);
  const fresh: number[] = [];
  for (const id of ticketIds) {
    if (next.has(id)) continue;
    next.add(id);
    if (seen) fresh.push(id);
  }
  return { fresh, seen: next };
}
