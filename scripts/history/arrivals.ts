// How many orders a day brings and when they arrive: a flat base over opening hours with two
// rushes on top (a mixture of normals), from the demo scenario's "Year of history".
import type { Random } from './random';

const H = 3600;
export const OPEN_SECONDS = 6.5 * H; // 06:30
export const CLOSE_SECONDS = 15 * H; // 15:00
/** The till takes its last order a little before closing, so the bar can finish by 15:00. */
export const LAST_ORDER_SECONDS = 14 * H + 50 * 60;

/** Orders on a typical day, by weekday (0 = Sunday): 420 on weekdays, 560 Saturday, 480 Sunday. */
export function typicalOrders(weekday: number): number {
  if (weekday === 6) return 560;
  if (weekday === 0) return 480;
  return 420;
}

/** The day's count: the typical count with up to ±10 % noise. */
export function ordersOnDay(weekday: number, random: Random): number {
  return Math.round(typicalOrders(weekday) * random.between(0.9, 1.1));
}

/**
 * Morning rush 07:15–08:45 (centred at 08:00) and lunch 12:00–13:00 (centred at 12:30), each
 * about ±1.3 sd wide, over a flat base that keeps the quiet hours from being empty.
 */
const MIXTURE = [
  { weight: 0.36, kind: 'flat' as const },
  { weight: 0.42, kind: 'normal' as const, mean: 8 * H, sd: 34 * 60 },
  { weight: 0.22, kind: 'normal' as const, mean: 12.5 * H, sd: 23 * 60 },
];

function oneArrival(random: Random): number {
  const part = random.weighted(MIXTURE.map((m) => [m, m.weight] as const));
  for (;;) {
    const t = part.kind === 'flat' ? random.between(OPEN_SECONDS, LAST_ORDER_SECONDS) : random.normal(part.mean, part.sd);
    if (t >= OPEN_SECONDS && t < LAST_ORDER_SECONDS) return t; // outside opening hours: draw again
  }
}

/** Arrival times in seconds after local midnight, earliest first, at millisecond precision. */
export function arrivalTimes(count: number, random: Random): number[] {
  const times = Array.from({ length: count }, () => Math.round(oneArrival(random) * 1000) / 1000);
  return times.sort((a, b) => a - b);
}
