// What a drink ordered now waits, in the words the Counter and Pulse both use, and the staffing
// sentence that never contradicts it: a model of the bar in steady state (Erlang C) can say
// "40 s" while 20 drinks are queued; the drinks on the bar now decide the wait now.
import { z } from 'zod';
import type { StaffingAdvice } from './erlang';
import { MAX_CUPS } from './order-quantity';
import { quoteLabel } from './quote';

/** GET /api/wait-now: how many bar drinks the customer is about to order (1 when none is picked yet),
 * up to the cups one order may hold. */
export const waitNowQuery = z.object({ drinks: z.coerce.number().int().min(0).max(MAX_CUPS).default(1) });

/** What the Counter shows before payment: the quote for these drinks now. */
export type CounterWaitNow = Omit<WaitNow, 'withOneMoreSeconds'>;

/** "about 6 min": a wait said in whole minutes, rounded up, as the Counter tells a customer. */
export const aboutMinutes = (seconds: number) =>
  quoteLabel(seconds)
    .replace(/^About/, 'about')
    .replace('Ready now', 'no wait');

const drinksWord = (n: number) => (n === 1 ? '1 drink' : `${n} drinks`);

export interface WaitNow {
  /** Bar drinks queued or being made. */
  drinksOnBar: number;
  baristas: number;
  /** The quote for one more drink now, and the same with one more barista. */
  seconds: number;
  withOneMoreSeconds: number;
}

/**
 * The staffing sentence: the steady-state advice when the bar's queue is about what the model
 * expects, else the queue first. `modelSeconds` is the model's time to ready (its wait before a
 * start plus a make time), null when the bar can't keep up; `makeSeconds` the make time: a wait
 * now more than one drink's make time past the model's means a queue the model doesn't see.
 */
export function staffingSentence(advice: StaffingAdvice, now: WaitNow, modelSeconds: number | null, makeSeconds: number): string {
  const more = now.baristas + 1;
  const queue =
    `A drink ordered now is ready in ${aboutMinutes(now.seconds)} (${drinksWord(now.drinksOnBar)} on the bar); ` +
    `with ${more} on bar, ${aboutMinutes(now.withOneMoreSeconds)}.`;
  if (modelSeconds === null) return `${advice.sentence} ${queue}`;
  if (now.seconds > modelSeconds + makeSeconds) return `The bar keeps up with what comes in, but has a queue to clear. ${queue}`;
  return advice.sentence;
}
