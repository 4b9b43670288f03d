/**
 * roundHalfUp (grading/rounding.ts) without string or BigInt work for the values where the answer
 * is certain in floating point, and the plain function everywhere else — so the result is the
 * plain one, bit for bit.
 *
 * Why it is exact: let y = x·10^d computed in binary64 (one rounding, relative error ≤ 2⁻⁵³).
 * The plain rule rounds the 15-significant-digit snap of x, which differs from x by at most
 * 5·10⁻¹⁵ relatively. So when y lies farther than 10⁻¹³·y from every half-integer k + ½, the
 * snapped decimal and y are on the same side of that tie, and half-up gives k' = ⌊y + ½⌋ for both
 * (y + ½ is exact for y < 2⁵²). The plain answer is then Number("k'e-d"), the double nearest
 * k'/10^d, which IEEE division k' / 10^d also gives (both operands exact, division correctly
 * rounded). Near a tie, for negatives, for |y| ≥ 2⁵² and for non-finite input we call the plain
 * function (which also throws its own errors).
 *
 * Cost O(1) with no allocation on the fast branch. Property-tested equal to roundHalfUp.
 */
import { roundHalfUp } from '../grading/rounding';

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20];
const MARGIN = 1e-13;
const LIMIT = 2 ** 52;

export function roundHalfUpFast(x: number, decimals: number): number {
  const scale = POW10[decimals];
  if (scale === undefined || !(x > 0) || !Number.isInteger(decimals)) return roundHalfUp(x, decimals);
  const y = x * scale;
  if (!(y < LIMIT)) return roundHalfUp(x, decimals);
  const k = Math.floor(y);
  const distance = Math.abs(y - k - 0.5);
  if (distance <= MARGIN * y) return roundHalfUp(x, decimals);
  const up = y - k > 0.5 ? k + 1 : k;
  return decimals === 0 ? up : up / scale;
}
