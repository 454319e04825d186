// Milk lanes: the bar's open drinks grouped by milk, each lane oldest ticket first (rushed first).
// The shot count is a mark on the card, never a section that reorders the lane. Lanes keep the
// menu's milk order, so a lane stays where the baristas last saw it however many drinks it holds.
import { planJugs, pourOrder, type Jug, type JugRules } from './jug-plan';
import type { DrinkView, MilkRef, Service, TicketView } from './types';

/**
 * A drink in a milk lane, with its ticket's number, name and age, and its place in it. The Bar
 * shows each one as a DrinkCard (`src/features/bar/drink-card.tsx`).
 */
export interface LaneDrink extends DrinkView {
  ticketNumber: number;
  customerName: string;
  firedAt: string;
  rushedAt: string | null;
  /** Who took the order at the counter. */
  takenBy?: string | null;
  /** Here (a mug) or to go (a paper cup). */
  service: Service;
  /** The ticket's allergy, if any; the drink can't be bumped until it is acknowledged. */
  allergens: string[];
  allergyNote: string | null;
  /** 1-based place of this drink among the ticket's bar drinks, and how many there are. */
  indexInTicket: number;
  ticketSize: number;
}

export interface Lane {
  /** `milk:<id>` or `none`. */
  key: string;
  milk: MilkRef | null;
  /** Rushed first, then oldest ticket first. */
  drinks: LaneDrink[];
  drinkCount: number;
  oldestFiredAt: string;
}

/** What lane order reads of a drink and its ticket. */
interface Aged {
  rushedAt: string | null;
  firedAt: string;
  ticketId: number;
  id: number;
}

/** Rushed tickets first (in the order they were rushed), then oldest first. */
export const byAge = (a: Aged, b: Aged) =>
  (a.rushedAt ? 0 : 1) - (b.rushedAt ? 0 : 1) ||
  (a.rushedAt ?? '').localeCompare(b.rushedAt ?? '') ||
  a.firedAt.localeCompare(b.firedAt) ||
  a.ticketId - b.ticketId ||
  a.id - b.id;

export const hasAllergy = (d: { allergens: string[]; allergyNote: string | null }) => d.allergens.length > 0 || !!d.allergyNote;
export const needsAllergyAck = (d: LaneDrink) => hasAllergy(d) && d.allergyAckAt === null;

export function groupIntoLanes(tickets: TicketView[]): Lane[] {
  const lanes = new Map<string, { milk: MilkRef | null; cards: LaneDrink[] }>();
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
        rushedAt: ticket.rushedAt,
        takenBy: ticket.takenBy ?? null,
        service: ticket.service,
        allergens: ticket.allergens,
        allergyNote: ticket.allergyNote,
        indexInTicket: i + 1,
        ticketSize: ticket.drinks.length,
      });
      lanes.set(key, lane);
    });
  }

  const result: Lane[] = [];
  for (const [key, { milk, cards }] of lanes) {
    cards.sort(byAge);
    result.push({
      key,
      milk,
      drinks: cards,
      drinkCount: cards.length,
      oldestFiredAt: cards.reduce((m, c) => (c.firedAt < m ? c.firedAt : m), cards[0].firedAt),
    });
  }
  return result.sort(byMenuOrder);
}

/** The menu's milk order (its place, then its id), the no-milk lane last. */
const byMenuOrder = (a: Lane, b: Lane) =>
  (a.milk ? 0 : 1) - (b.milk ? 0 : 1) || (a.milk?.sort ?? 0) - (b.milk?.sort ?? 0) || (a.milk?.id ?? 0) - (b.milk?.id ?? 0);

export interface ShotPlan {
  /** Shots still to pull (drinks not started yet) and the coffee they take, in 0.1 g. */
  shots: number;
  doseDg: number;
}

export interface PlannedLane extends Lane {
  jugPlan: Jug[];
  shotPlan: ShotPlan;
}

export function shotPlan(cards: LaneDrink[]): ShotPlan {
  const waiting = cards.filter((c) => c.status === 'queued');
  return { shots: waiting.reduce((n, c) => n + c.shots, 0), doseDg: waiting.reduce((n, c) => n + c.doseDg, 0) };
}

/**
 * A lane's jugs: first the jugs baristas have started, in the order they were started, each with
 * the drinks still on the bar that it was started with and the pour it was started with; then the
 * queued drinks planned oldest first. A started jug never gains a drink and never loses one to a
 * re-plan: only a bump takes a drink out of it (a recall puts it back). A drink being made
 * outside any jug (started on its own before it needed one, or bumped straight from the queue and
 * then recalled) has had its milk: it is in no jug.
 */
export function laneJugs(cards: LaneDrink[], rules: JugRules): Jug[] {
  const started = new Map<number, LaneDrink[]>();
  for (const c of cards) if (c.jug && c.status !== 'done') started.set(c.jug.id, [...(started.get(c.jug.id) ?? []), c]);
  const fixed = [...started.entries()]
    .sort(([a], [b]) => a - b)
    .map(([jugId, drinks]): Jug => {
      const { id: _id, ...pour } = drinks[0].jug!;
      return { jugId, ...pour, drinkIds: pourOrder(drinks).map((d) => d.id) };
    });
  return [
    ...fixed,
    ...planJugs(
      cards.filter((c) => c.status === 'queued' && !c.jug),
      rules,
    ),
  ];
}

/** Lanes with their jug plan and shot plan: what the Bar shows and GET /api/bar/lanes answers. */
export function planBar(tickets: TicketView[], rules: JugRules): { lanes: PlannedLane[]; shotPlan: ShotPlan } {
  const lanes = groupIntoLanes(tickets).map((lane) => {
    return { ...lane, jugPlan: laneJugs(lane.drinks, rules), shotPlan: shotPlan(lane.drinks) };
  });
  const all = lanes.map((l) => l.shotPlan);
  return {
    lanes,
    shotPlan: { shots: all.reduce((n, s) => n + s.shots, 0), doseDg: all.reduce((n, s) => n + s.doseDg, 0) },
  };
}
