import { defined, notDefined, type Defined } from '../defined';
import { quantileSorted } from './quantile';
import { sampleSd } from './standardDeviation';
import { assertFiniteNumber, assertFiniteValues, sortedCopy } from './validate';

/**
 * Histogram bins by a named rule.
 *
 * | rule | formula | source |
 * |---|---|---|
 * | Sturges | k = ⌈log₂ n + 1⌉ classes of equal width over [min, max] | Sturges (1926) JASA 21:65–66 |
 * | Scott | h = 3.49·s·n^(−1/3), s = sample SD | Scott (1979) Biometrika 66:605–610 (R uses 3.5) |
 * | Freedman–Diaconis | h = 2·IQR·n^(−1/3), IQR by Hyndman–Fan type 7 | Freedman & Diaconis (1981) Z. Wahrsch. 57:453–476 |
 * | fixed | the given width h, edges at origin + k·h (origin default 0) | — |
 *
 * Bins are half-open [lower, upper), except the last, which is closed [lower, upper], so the
 * maximum is counted (a mark of 100 with width 10 lands in [90, 100], not a bin of its own).
 * Scott and Freedman–Diaconis bins start at the minimum; k = ⌈range / h⌉ (at least 1).
 *
 * Not defined (no fallback): n = 0; all values equal for Sturges/Scott/FD (nothing to spread
 * over — use a fixed width); IQR = 0 for FD; width ≤ 0; more than MAX_BINS bins.
 * Counts always sum to n and the bins cover min…max.
 *
 * Cost O(n log n) (sort for the IQR) + O(k).
 */

export type BinRule =
  | { kind: 'sturges' }
  | { kind: 'scott' }
  | { kind: 'freedmanDiaconis' }
  | { kind: 'fixed'; width: number; origin?: number };

export interface Bin {
  lower: number;
  upper: number;
  count: number;
}

export interface Histogram {
  /** Human-readable rule with its numbers, e.g. "Sturges (1926): k = ⌈log₂ 100 + 1⌉ = 8". */
  rule: string;
  binWidth: number;
  bins: readonly Bin[];
}

/** Refuse to build more bins than a chart can show; the caller should choose a wider width. */
export const MAX_BINS = 10_000;

/**
 * Sturges' number of classes, k = ⌈log₂ n + 1⌉ (Sturges 1926).
 * @example
 * sturgesBinCount(100); // => 8
 */
export function sturgesBinCount(n: number): number {
  if (!Number.isInteger(n) || n < 1) throw new Error(`sturgesBinCount: n is ${n}; a positive integer is required`);
  return Math.ceil(Math.log2(n) + 1);
}

/**
 * Scott's bin width, h = 3.49·s·n^(−1/3) (Scott 1979).
 * @example
 * scottBinWidth(10, 1000); // => 3.4900000000000007 (3.49·10·1000^(−1/3))
 */
export function scottBinWidth(sd: number, n: number): number {
  return 3.49 * sd * Math.cbrt(1 / n);
}

/**
 * Freedman–Diaconis bin width, h = 2·IQR·n^(−1/3) (Freedman & Diaconis 1981).
 * @example
 * freedmanDiaconisBinWidth(10, 1000); // => 2
 */
export function freedmanDiaconisBinWidth(iqr: number, n: number): number {
  return 2 * iqr * Math.cbrt(1 / n);
}

/**
 * A width too small to step from `start` in binary64 (h underflows to 0, or start + h rounds back
 * to start, as with subnormal spreads) makes no bins; the reason says so.
 */
function widthProblem(start: number, h: number): string | null {
  return h > 0 && start + h > start ? null : `the values are too close together (bin width ${h}) to be split into bins at double precision`;
}

/** Count values into k bins with edges lower_i = start + i·h (last bin closed at `end`). */
function fill(sorted: readonly number[], start: number, h: number, k: number, end: number): Bin[] {
  const edge = (i: number): number => (i === k ? end : start + i * h);
  const bins: Bin[] = Array.from({ length: k }, (_, i) => ({ lower: edge(i), upper: edge(i + 1), count: 0 }));
  for (const x of sorted) {
    let i = Math.min(Math.max(Math.floor((x - start) / h), 0), k - 1);
    // Correct the rounding of (x − start)/h against the reported edges.
    while (i > 0 && x < (bins[i] as Bin).lower) i--;
    while (i < k - 1 && x >= (bins[i] as Bin).upper) i++;
    (bins[i] as Bin).count++;
  }
  return bins;
}

/**
 * @throws {Error} on NaN/infinite values, width or origin
 * @example
 * histogram([1, 2, 2, 3, 9], { kind: 'fixed', width: 5 });
 * // => defined: bins [0, 5) count 4, [5, 10] count 1
 */
export function histogram(values: readonly number[], rule: BinRule): Defined<Histogram> {
  assertFiniteValues('histogram', values);
  return histogramOfSorted(sortedCopy(values), rule);
}

/**
 * histogram() of finite values already sorted ascending (the caller's guarantee; not re-checked),
 * so a caller that sorted once — the fast statistics — does not sort again.
 */
export function histogramOfSorted(sorted: readonly number[], rule: BinRule): Defined<Histogram> {
  const n = sorted.length;
  if (n === 0) return notDefined('no values (n = 0)');
  const min = sorted[0] as number;
  const max = sorted[n - 1] as number;
  const range = max - min;

  if (rule.kind === 'fixed') {
    assertFiniteNumber('histogram', rule.width, 'bin width');
    const origin = rule.origin ?? 0;
    assertFiniteNumber('histogram', origin, 'origin');
    if (rule.width <= 0) return notDefined(`bin width is ${rule.width}; it must be greater than 0`);
    const h = rule.width;
    let first = Math.floor((min - origin) / h);
    if (origin + first * h > min) first--; // rounding (or underflow) in the division
    const start = origin + first * h;
    const tooNarrow = widthProblem(start, h);
    if (tooNarrow !== null) return notDefined(tooNarrow);
    let k = Math.max(1, Math.ceil((max - start) / h));
    if (start + k * h < max) k++; // rounding in the division
    if (k > MAX_BINS) return notDefined(`a width of ${h} needs ${k} bins (more than ${MAX_BINS}); choose a wider width`);
    return defined({ rule: `fixed width ${h} from origin ${origin}`, binWidth: h, bins: fill(sorted, start, h, k, start + k * h) });
  }

  if (range === 0) return notDefined(`all ${n} values equal ${min}; a ${rule.kind} histogram needs spread (use a fixed width)`);

  if (rule.kind === 'sturges') {
    const k = sturgesBinCount(n);
    const h = range / k;
    const tooNarrow = widthProblem(min, h);
    if (tooNarrow !== null) return notDefined(tooNarrow);
    return defined({ rule: `Sturges (1926): k = ⌈log₂ ${n} + 1⌉ = ${k}`, binWidth: h, bins: fill(sorted, min, h, k, max) });
  }

  let h: number;
  let label: string;
  if (rule.kind === 'scott') {
    const s = sampleSd(sorted);
    if (!s.defined) return notDefined(`Scott's rule needs the sample SD: ${s.reason}`);
    h = scottBinWidth(s.value, n);
    label = `Scott (1979): h = 3.49·s·n^(−1/3) = ${h}`;
  } else {
    const iqr = quantileSorted(sorted, 0.75, 7) - quantileSorted(sorted, 0.25, 7);
    if (iqr === 0) return notDefined('IQR is 0 (more than half the values are equal); the Freedman–Diaconis width would be 0 — use Sturges, Scott or a fixed width');
    h = freedmanDiaconisBinWidth(iqr, n);
    label = `Freedman–Diaconis (1981): h = 2·IQR·n^(−1/3) = ${h}`;
  }
  const tooNarrow = widthProblem(min, h);
  if (tooNarrow !== null) return notDefined(tooNarrow);
  const k = Math.max(1, Math.ceil(range / h));
  if (k > MAX_BINS) return notDefined(`the rule gives ${k} bins (more than ${MAX_BINS})`);
  const end = Math.max(min + k * h, max);
  return defined({ rule: label, binWidth: h, bins: fill(sorted, min, h, k, end) });
}
