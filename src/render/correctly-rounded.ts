/**
 * cos, sin and 10^x correctly rounded to the nearest float64, for the biquad
 * coefficients of biquad-filter.ts.
 *
 * node-web-audio-api 1.0.9 computes a BiquadFilterNode's coefficients with
 * the C library's cos, sin and pow (GNU libc on Linux), which round
 * correctly for our arguments; JavaScript's Math.pow does not always (V8
 * gives 10^0.11613034009933472 one unit in the last place low: 1.306562953884617
 * against 1.3065629538846173, the nearest float64 to 1.306562953884617216…).
 * One unit in the last place of one coefficient is enough to change a
 * float32 output sample now and then, so these are computed here from
 * their series in exact integer arithmetic and rounded once.
 *
 * Method: fixed point with FRACTION_BITS bits after the point (BigInt).
 * The argument, a float64, converts exactly. Series (any calculus text, e.g.
 * M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions, 1964,
 * 4.2.1, 4.3.65–66, 4.1.24):
 *   e^x = Σ xⁿ/n!        cos x = Σ (−1)ⁿ x²ⁿ/(2n)!      sin x = Σ (−1)ⁿ x²ⁿ⁺¹/(2n+1)!
 *   ln 10 = 3·ln 2 + ln(5/4),  ln(a) = 2·atanh((a − 1)/(a + 1)),  atanh y = Σ y²ⁿ⁺¹/(2n+1)
 * 10^x = e^(x·ln 10), with e^x = (e^(x/2^k))^(2^k) so the series starts
 * below 1/2. Each term is truncated (error below one unit of 2^−FRACTION_BITS
 * per operation; a few hundred operations), so the sum is good to far better
 * than 2^−200, and rounding it to 53 bits is the correctly rounded value
 * unless the true value lies within that of a midpoint between two
 * float64s (for a transcendental function of a float64 argument, not at
 * all in practice).
 *
 * For the arguments a chain uses (angles in (0, π), exponents of size below
 * a few hundred); slow (tens of microseconds), so callers keep the results.
 */

/** Fixed-point fraction bits (our choice: 256, far more than the 53 a float64 keeps). */
const FRACTION_BITS = 256n;
const ONE = 1n << FRACTION_BITS;
/** Halvings of the argument before the exponential series (our choice: brings x·ln 10 below 1/2 for |x| < 2⁹/ln 10). */
const EXP_HALVINGS = 10;
/** Float64 significand bits, including the hidden one (IEEE 754-2019 binary64: p = 53). */
const SIGNIFICAND_BITS = 53;

/** a·b in fixed point (truncated). */
function multiply(a: bigint, b: bigint): bigint {
  return (a * b) >> FRACTION_BITS;
}

/** A float64 as an exact fixed-point number (truncated below 2^−FRACTION_BITS). */
function toFixed(value: number): bigint {
  if (value === 0) return 0n;
  const sign = value < 0 ? -1n : 1n;
  let magnitude = Math.abs(value);
  let exponent = 0; // magnitude = m · 2^exponent with m an integer below 2^53
  while (!Number.isInteger(magnitude)) {
    magnitude *= 2; // exact: doubling a float64 only changes its exponent
    exponent -= 1;
  }
  const scaled = BigInt(magnitude);
  const shift = BigInt(exponent) + FRACTION_BITS;
  return sign * (shift >= 0n ? scaled << shift : scaled >> -shift);
}

/** The float64 nearest to a fixed-point number (ties to even). */
function toFloat64(fixed: bigint): number {
  if (fixed === 0n) return 0;
  const negative = fixed < 0n;
  const magnitude = negative ? -fixed : fixed;
  const bits = magnitude.toString(2).length;
  let exponent = BigInt(bits) - FRACTION_BITS - 1n; // value in [2^exponent, 2^(exponent+1))
  const drop = BigInt(bits - SIGNIFICAND_BITS);
  let significand: bigint;
  if (drop > 0n) {
    significand = magnitude >> drop;
    const rest = magnitude - (significand << drop);
    const half = 1n << (drop - 1n);
    if (rest > half || (rest === half && (significand & 1n) === 1n)) significand += 1n;
    if (significand >> BigInt(SIGNIFICAND_BITS) !== 0n) {
      significand >>= 1n;
      exponent += 1n;
    }
  } else {
    significand = magnitude << -drop;
  }
  const value = Number(significand) * 2 ** (Number(exponent) - (SIGNIFICAND_BITS - 1));
  return negative ? -value : value;
}

/** e^x for a fixed-point x with |x| ≤ 1/2: Σ xⁿ/n! until the terms vanish. */
function expSmall(x: bigint): bigint {
  let sum = ONE;
  let term = ONE;
  for (let n = 1n; term !== 0n; n += 1n) {
    term = multiply(term, x) / n;
    sum += term;
  }
  return sum;
}

/** atanh y = Σ y²ⁿ⁺¹/(2n+1) for a fixed-point y with |y| ≤ 1/3. */
function atanhSmall(y: bigint): bigint {
  const square = multiply(y, y);
  let power = y;
  let sum = 0n;
  for (let n = 1n; power !== 0n; n += 2n) {
    sum += power / n;
    power = multiply(power, square);
  }
  return sum;
}

let ln10: bigint | undefined;
/** ln 10 = 3·ln 2 + ln(5/4) = 6·atanh(1/3) + 2·atanh(1/9), in fixed point (made once). */
function fixedLn10(): bigint {
  ln10 ??= 6n * atanhSmall(ONE / 3n) + 2n * atanhSmall(ONE / 9n);
  return ln10;
}

/** 10^x, correctly rounded (see above). */
export function roundedPow10(x: number): number {
  let value = expSmall(multiply(toFixed(x), fixedLn10()) >> BigInt(EXP_HALVINGS));
  for (let i = 0; i < EXP_HALVINGS; i += 1) value = multiply(value, value);
  return toFloat64(value);
}

/** cos x and sin x together, correctly rounded (see above); |x| up to about 4. */
export function roundedCosSin(x: number): { readonly cos: number; readonly sin: number } {
  const fixed = toFixed(x);
  let cos = 0n;
  let sin = 0n;
  let term = ONE; // xⁿ/n!, sign alternating every second n
  for (let n = 0n; term !== 0n; n += 1n) {
    const signed = (n / 2n) % 2n === 0n ? term : -term;
    if (n % 2n === 0n) cos += signed;
    else sin += signed;
    term = multiply(term, fixed) / (n + 1n);
  }
  return Object.freeze({ cos: toFloat64(cos), sin: toFloat64(sin) });
}
