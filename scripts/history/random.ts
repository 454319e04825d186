// A small seeded random generator (sfc32, seeded through splitmix32), so a history run with the
// same seed writes the same rows. Pure: no Math.random, no clock.

export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Whole number in [min, max], both included. */
  int(min: number, max: number): number;
  /** Uniform in [min, max). */
  between(min: number, max: number): number;
  chance(p: number): boolean;
  /** Standard normal (Box–Muller). */
  normal(mean?: number, sd?: number): number;
  /** Exponential with the given mean. */
  exponential(mean: number): number;
  pick<T>(items: readonly T[]): T;
  /** One of the choices, each as likely as its weight. */
  weighted<T>(choices: readonly (readonly [T, number])[]): T;
}

/** A 32-bit string hash (FNV-1a), to turn a seed and a day into a stream of its own. */
export function hash32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

function splitmix32(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
}

export function createRandom(seed: number | string): Random {
  const mix = splitmix32(typeof seed === 'number' ? seed : hash32(seed));
  let a = mix();
  let b = mix();
  let c = mix();
  let d = mix();
  const next = () => {
    // sfc32 (Chris Doty-Humphrey's Small Fast Counting generator)
    const t = (((a + b) | 0) + d) | 0;
    d = (d + 1) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  };
  for (let i = 0; i < 12; i++) next(); // let the state settle

  const random: Random = {
    next,
    int: (min, max) => min + Math.floor(next() * (max - min + 1)),
    between: (min, max) => min + next() * (max - min),
    chance: (p) => next() < p,
    normal(mean = 0, sd = 1) {
      const u = 1 - next(); // (0, 1]: log(0) never happens
      return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * next());
    },
    exponential: (mean) => -mean * Math.log(1 - next()),
    pick: (items) => items[Math.floor(next() * items.length)],
    weighted(choices) {
      const total = choices.reduce((sum, [, w]) => sum + w, 0);
      let r = next() * total;
      for (const [value, w] of choices) {
        r -= w;
        if (r < 0) return value;
      }
      return choices[choices.length - 1][0];
    },
  };
  return random;
}
