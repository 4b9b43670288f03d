import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteNumber, assertFiniteValues, sortedCopy } from './validate';

/**
 * Sample quantiles — the nine definitions of Hyndman & Fan (1996), "Sample quantiles in
 * statistical packages", The American Statistician 50(4):361–365.
 *
 * For sorted data x₍₁₎ ≤ … ≤ x₍ₙ₎ and 0 ≤ p ≤ 1:
 *   Q(p) = (1 − γ)·x₍ⱼ₎ + γ·x₍ⱼ₊₁₎,  j = ⌊np + m⌋,  g = np + m − j,
 * with m and γ set by the type (table in QUANTILE_METHODS) and order statistics clamped to
 * x₍₁₎…x₍ₙ₎ (x₍₀₎ := x₍₁₎, x₍ₙ₊₁₎ := x₍ₙ₎).
 *
 * Floating point: np + m is computed in the algebraically equal form with the fewest roundings
 * (type 7: 1 + (n − 1)p, type 6: (n + 1)p, …), then snapped to the nearest integer when it is
 * within 4 ulps of it (|h − round(h)| ≤ 4·ε·max(1, |h|)). Without the snap, 10 × 0.7 =
 * 7.000000000000001 would give g > 0 and make types 1–3 jump to the next order statistic.
 * R's quantile() uses the same idea with an absolute fuzz of 4ε (from memory); ours is relative
 * so it still works for large n. The interpolation is written x₍ⱼ₎ + γ·(x₍ⱼ₊₁₎ − x₍ⱼ₎), which
 * returns x₍ⱼ₎ exactly when γ = 0 or the two are equal; γ = 1 returns x₍ⱼ₊₁₎ exactly.
 */

export type QuantileType = 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8 | 9;

export const QUANTILE_TYPES: readonly QuantileType[] = [1, 2, 3, 4, 5, 6, 7, 8, 9];

export const QUANTILE_METHODS: Record<QuantileType, { name: string; description: string }> = {
  1: { name: 'Hyndman–Fan type 1 (inverse ECDF)', description: 'm = 0; γ = 0 if g = 0, else 1. The smallest value with ECDF ≥ p; no averaging.' },
  2: { name: 'Hyndman–Fan type 2 (inverse ECDF, averaged at jumps)', description: 'm = 0; γ = ½ if g = 0, else 1. Like type 1 but averages the two values where the ECDF is flat.' },
  3: { name: 'Hyndman–Fan type 3 (nearest even order statistic)', description: 'm = −½; γ = 0 if g = 0 and j is even, else 1. The nearest order statistic, ties to the even one.' },
  4: { name: 'Hyndman–Fan type 4 (linear, k/n)', description: 'm = 0; γ = g. Linear interpolation of the ECDF; plotting position k/n.' },
  5: { name: 'Hyndman–Fan type 5 (linear, (k−½)/n)', description: 'm = ½; γ = g. Piecewise linear through the midpoints of the ECDF steps.' },
  6: { name: 'Hyndman–Fan type 6 (linear, k/(n+1))', description: 'm = p; γ = g. Plotting position k/(n+1); the default of Minitab and SPSS.' },
  7: { name: 'Hyndman–Fan type 7 (linear, (k−1)/(n−1))', description: 'm = 1 − p; γ = g. Plotting position (k−1)/(n−1); the default of R, NumPy, spreadsheets.' },
  8: { name: 'Hyndman–Fan type 8 (linear, (k−⅓)/(n+⅓))', description: 'm = (p + 1)/3; γ = g. Approximately median-unbiased; recommended by Hyndman & Fan.' },
  9: { name: 'Hyndman–Fan type 9 (linear, (k−⅜)/(n+¼))', description: 'm = p/4 + 3/8; γ = g. Approximately unbiased for normal data (Blom).' },
};

/** h = np + m for the type, in a form with few roundings. */
function position(n: number, p: number, type: QuantileType): number {
  switch (type) {
    case 1:
    case 2:
    case 4:
      return n * p;
    case 3:
      return n * p - 0.5;
    case 5:
      return n * p + 0.5;
    case 6:
      return (n + 1) * p;
    case 7:
      return 1 + (n - 1) * p;
    case 8:
      return (n + 1 / 3) * p + 1 / 3;
    case 9:
      return (n + 0.25) * p + 0.375;
  }
}

/** Snap h to an integer when it is within 4 ulps of one (see the module comment). */
function snap(h: number): number {
  const r = Math.round(h);
  return Math.abs(h - r) <= 4 * Number.EPSILON * Math.max(1, Math.abs(h)) ? r : h;
}

function gamma(g: number, j: number, type: QuantileType): number {
  switch (type) {
    case 1:
      return g === 0 ? 0 : 1;
    case 2:
      return g === 0 ? 0.5 : 1;
    case 3:
      return g === 0 && j % 2 === 0 ? 0 : 1;
    default:
      return g;
  }
}

/**
 * Quantile of already-sorted data by one of the nine Hyndman & Fan (1996) definitions.
 *
 * Cost O(1). The caller guarantees ascending order (not re-checked, for speed).
 * @throws {Error} if `sorted` is empty, p is outside [0, 1] or not finite, or type is not 1…9
 * @example
 * quantileSorted([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 0.25);    // => 3.25 (type 7)
 * quantileSorted([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 0.25, 6); // => 2.75
 */
export function quantileSorted(sorted: readonly number[], p: number, type: QuantileType = 7): number {
  const n = sorted.length;
  if (n === 0) throw new Error('quantileSorted requires at least one data point');
  assertFiniteNumber('quantileSorted', p, 'p');
  if (p < 0 || p > 1) throw new Error(`quantileSorted: p is ${p}; it must be between 0 and 1`);
  if (!(type in QUANTILE_METHODS)) throw new Error(`quantileSorted: type is ${String(type)}; it must be 1 to 9`);
  const h = snap(position(n, p, type));
  const j = Math.floor(h);
  const g = h - j;
  const gm = gamma(g, j, type);
  const at = (k: number): number => sorted[Math.min(Math.max(k, 1), n) - 1] as number;
  const lo = at(j);
  if (gm === 0) return lo;
  const hi = at(j + 1);
  if (gm === 1) return hi;
  // Clamp: rounding in lo + γ·(hi − lo) may overshoot hi by an ulp; keeps Q monotone in p.
  return Math.min(Math.max(lo + gm * (hi - lo), lo), hi);
}

/**
 * Quantile of unsorted values (sorts a copy). Not defined for n = 0.
 *
 * Cost O(n log n).
 * @throws {Error} on NaN/infinite values, p outside [0, 1], or a type other than 1…9
 * @example
 * quantile([49, 6, 15, 7, 36, 39, 40, 41, 42, 43, 47], 0.75, 8); // => { defined: true, value: 42.8333… (257/6) }
 */
export function quantile(values: readonly number[], p: number, type: QuantileType = 7): Defined<number> {
  assertFiniteValues('quantile', values);
  if (values.length === 0) return notDefined('no values (n = 0)');
  return defined(quantileSorted(sortedCopy(values), p, type));
}
