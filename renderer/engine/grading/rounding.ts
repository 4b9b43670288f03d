/**
 * Rounding of the final percent: half-up on the decimal value, applied once.
 *
 * Rule (stated to users in the same words):
 *   1. Snap x to 15 significant decimal digits (`x.toExponential(14)`). Every double carries at
 *      least 15 correct significant digits, so this recovers the decimal the user typed or the
 *      formula meant: 2.675 (stored as 2.67499999999999982236431605997495353221893310546875)
 *      becomes 2.67500000000000, and a float sum such as 89.49999999999999 (ten 8.95s) becomes
 *      89.5000000000000.
 *   2. Round that decimal to `decimals` places with integer (BigInt) arithmetic, ties away from
 *      zero — "half-up" for the non-negative values marks are.
 *   3. Convert back with `Number("<digits>e-<decimals>")`, which is correctly rounded, so the
 *      result is the double nearest the decimal answer (0.1 + 0.2 at 1 decimal is exactly 0.3).
 *
 * Consequence, chosen deliberately: a value within about one part in 10^15 of a tie is treated as
 * the tie. No mark is ever that close to a boundary except through float artefacts.
 *
 * Source: half-up ("round half away from zero") is the school convention — common practice,
 * no source. 15 digits = DBL_DIG of IEEE 754 binary64 (ISO C <float.h>).
 *
 * Cost O(1). @throws RangeError when x is not finite or decimals is not an integer 0…20.
 * @example roundHalfUp(89.49999999999999, 0) // 90
 * @example roundHalfUp(2.675, 2)             // 2.68
 */
export function roundHalfUp(x: number, decimals: number): number {
  if (!Number.isFinite(x)) throw new RangeError(`roundHalfUp needs a finite number, got ${x}`);
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 20) {
    throw new RangeError(`roundHalfUp needs 0–20 whole decimals, got ${decimals}`);
  }
  if (x === 0) return 0;
  const negative = x < 0;
  // "d.dddddddddddddde±n": 15 significant digits D and exponent n, so |x| ≈ D × 10^(n − 14).
  const match = /^(\d)\.(\d{14})e([+-]\d+)$/.exec(Math.abs(x).toExponential(14));
  if (match === null) throw new RangeError(`roundHalfUp could not read ${x}`);
  const digits = BigInt(`${match[1]}${match[2]}`);
  const shift = Number(match[3]) - 14 + decimals; // |x| × 10^decimals = digits × 10^shift
  let scaled: bigint;
  if (shift >= 0) {
    scaled = digits * 10n ** BigInt(shift);
  } else {
    const divisor = 10n ** BigInt(-shift);
    scaled = digits / divisor;
    if ((digits % divisor) * 2n >= divisor) scaled += 1n;
  }
  if (scaled === 0n) return 0;
  const magnitude = Number(`${scaled}e-${decimals}`);
  return negative ? -magnitude : magnitude;
}

/**
 * Snap a float to 15 significant digits without rounding to a fixed number of places, for
 * comparisons and display of derived values (e.g. a gap of 0.30000000000000004 is 0.3).
 */
export function snap15(x: number): number {
  if (!Number.isFinite(x) || x === 0) return x === 0 ? 0 : x;
  return Number(x.toPrecision(15));
}
