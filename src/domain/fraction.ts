// Exact fractions on big integers, for the few decisions that must not hinge on a rounding error:
// whether the bar keeps up is "offered load < baristas", and at 72 drinks in 30 min at 75 s a drink
// the load is exactly 3 — floating point made it 2.9999999999999996.

export interface Fraction {
  num: bigint;
  /** always > 0 */
  den: bigint;
}

const gcd = (a: bigint, b: bigint): bigint => {
  a = a < 0n ? -a : a;
  while (b) [a, b] = [b, a % b];
  return a;
};

function reduced(num: bigint, den: bigint): Fraction {
  if (den === 0n) throw new RangeError('fraction: division by zero');
  if (den < 0n) [num, den] = [-num, -den];
  const g = gcd(num, den) || 1n;
  return { num: num / g, den: den / g };
}

/** The exact value of a finite double: every double is a whole number times a power of two. */
function exactOf(x: number): Fraction {
  if (!Number.isFinite(x)) throw new RangeError(`fraction: ${x} is not a finite number`);
  let den = 1n;
  while (!Number.isInteger(x)) {
    x *= 2; // exact: doubling a double only moves its exponent
    den *= 2n;
  }
  return reduced(BigInt(x), den);
}

const asFraction = (x: number | Fraction): Fraction => (typeof x === 'number' ? exactOf(x) : x);

/** num/den, each a whole number, a finite double (taken at its exact value) or a fraction. */
export function fraction(num: number | Fraction, den: number | Fraction = 1): Fraction {
  return div(asFraction(num), asFraction(den));
}

export const mul = (a: Fraction, b: Fraction) => reduced(a.num * b.num, a.den * b.den);
export const div = (a: Fraction, b: Fraction) => reduced(a.num * b.den, a.den * b.num);
export const sub = (a: Fraction, b: Fraction) => reduced(a.num * b.den - b.num * a.den, a.den * b.den);

/** −1, 0 or 1 as a is less than, equal to or greater than b. */
export function compare(a: Fraction, b: Fraction): number {
  const l = a.num * b.den;
  const r = b.num * a.den;
  return l < r ? -1 : l > r ? 1 : 0;
}

/** The largest whole number ≤ the fraction. */
export function floor(a: Fraction): bigint {
  const q = a.num / a.den; // truncates toward zero
  return a.num < 0n && q * a.den !== a.num ? q - 1n : q;
}

/** The nearest double (good to about 16 digits for the sizes a bar sees). */
export function toNumber(a: Fraction): number {
  const whole = floor(a);
  return Number(whole) + Number(a.num - whole * a.den) / Number(a.den);
}
