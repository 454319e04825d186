// What the bar's jug commands accept. The server checks a command with these, inside the
// command's transaction, against the drinks as stored; the rush property tests drive them too.
//
// "Start jug" names the drinks the barista saw in the jug: they become that jug for good (the
// jug is stored with its pour), whatever arrives afterwards. "Bump jug" names the jug and the
// drinks it showed: it bumps exactly those, and is refused when the jug's drinks still on the bar
// are not those (one was bumped on its own, or recalled into it, since the screen drew it).
import { makeJug, needsJug, type Jug, type JugDrink, type JugRules } from './jug-plan';
import type { DrinkStatus } from './types';

export interface JugCandidate extends JugDrink {
  milkId: number | null;
  status: DrinkStatus;
}

export type JugStart = { jug: Jug; refused?: undefined } | { refused: string; drinkId?: number };

/** `drinks` in lane order (oldest first): the jug they make, or why they can't make one. */
export function jugToStart(drinks: JugCandidate[], rules: JugRules): JugStart {
  const busy = drinks.find((d) => d.status !== 'queued');
  if (busy) return { refused: `Drink ${busy.id} is already ${busy.status === 'done' ? 'done' : 'being made'}`, drinkId: busy.id };
  const unsteamed = drinks.find((d) => !needsJug(d));
  if (unsteamed) return { refused: `Drink ${unsteamed.id} takes no steamed milk, so no jug`, drinkId: unsteamed.id };
  const other = drinks.find((d) => d.milkId !== drinks[0].milkId);
  if (other) return { refused: 'A jug holds one milk', drinkId: other.id };
  if (drinks.length > rules.maxDrinks) return { refused: `A jug takes at most ${rules.maxDrinks} drinks here` };
  const jug = makeJug(drinks, rules);
  return jug ? { jug } : { refused: 'More milk than any pitcher holds: start fewer drinks' };
}

/** Why "Bump jug" naming `named` can't bump a jug whose drinks on the bar are `open`, or null. */
export function jugBumpProblem(open: number[], named: number[]): string | null {
  if (open.length === 0) return 'This jug was already bumped';
  const same = open.length === named.length && named.every((id) => open.includes(id));
  return same ? null : 'This jug changed on another screen: look again, then bump it';
}
