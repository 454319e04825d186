// Milk lanes: the bar's open drinks grouped by milk, then by shot count, oldest ticket first.
import type { DrinkView, MilkRef, TicketView } from './types';

/** A drink as the bar shows it: with its ticket's number, name and age, and its place in it. */
export interface DrinkCard extends DrinkView {
  ticketNumber: number;
  customerName: string;
  firedAt: string;
  /** 1-based place of this drink among the ticket's bar drinks, and how many there are. */
  indexInTicket: number;
  ticketSize: number;
}

export interface ShotGroup {
  shots: number;
  drinks: DrinkCard[];
}

export interface Lane {
  /** `milk:<id>` or `none`. */
  key: string;
  milk: MilkRef | null;
  groups: ShotGroup[];
  drinkCount: number;
  oldestFiredAt: string;
}

const byAge = (a: DrinkCard, b: DrinkCard) =>
  a.firedAt.localeCompare(b.firedAt) || a.ticketId - b.ticketId || a.id - b.id;

export function groupIntoLanes(tickets: TicketView[]): Lane[] {
  const lanes = new Map<string, { milk: MilkRef | null; cards: DrinkCard[] }>();
  for (const ticket of tickets) {
    ticket.drinks.forEach((drink, i) => {
      if (drink.status === 'done') return;
      const key = drink.milk ? `milk:${drink.milk.id}` : 'none';
      const lane = lanes.get(key) ?? { milk: drink.milk, cards: [] };
      lane.cards.push({
        ...drink,
        ticketNumber: ticket.number,
        customerName: ticket.customerName,
        firedAt: ticket.firedAt,
        indexInTicket: i + 1,
        ticketSize: ticket.drinks.length,
      });
      lanes.set(key, lane);
    });
  }

  const result: Lane[] = [];
  for (const [key, { milk, cards }] of lanes) {
    cards.sort(byAge);
    const byShots = new Map<number, DrinkCard[]>();
    for (const card of cards) byShots.set(card.shots, [...(byShots.get(card.shots) ?? []), card]);
    const groups = [...byShots.entries()]
      .sort(([a], [b]) => a - b)
      .map(([shots, drinks]) => ({ shots, drinks }));
    result.push({ key, milk, groups, drinkCount: cards.length, oldestFiredAt: cards[0].firedAt });
  }
  // Widest lane first, so the milk with the most drinks waiting gets the most room;
  // on a tie the lane holding the oldest ticket goes first.
  return result.sort(
    (a, b) => b.drinkCount - a.drinkCount || a.oldestFiredAt.localeCompare(b.oldestFiredAt) || a.key.localeCompare(b.key),
  );
}
