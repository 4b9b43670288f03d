import { defined, notDefined, type Defined } from '../defined';
import { assertFiniteValues } from './validate';

/**
 * Mode(s): every value that occurs the greatest number of times, in ascending order.
 *
 * Rule (common practice, no source): when the greatest count is 1 — every value occurs once —
 * there is no mode, and the result is not defined with the reason "no mode: every value occurs
 * once". Otherwise all values sharing the greatest count are returned (so [1, 1, 2, 2] has the
 * two modes 1 and 2). Values are compared exactly (SameValueZero: −0 equals 0), so marks should
 * be rounded to their recorded precision before counting.
 *
 * Cost O(n log n) (sort of the distinct modes). Not defined for n = 0.
 * @throws {Error} if a value is NaN or infinite
 * @example
 * modes([70, 80, 80, 90, 90]); // => { defined: true, value: [80, 90] }
 */
const NO_VALUES = 'no values (n = 0)';
const NO_MODE = 'no mode: every value occurs once';

export function modes(values: readonly number[]): Defined<number[]> {
  assertFiniteValues('modes', values);
  if (values.length === 0) return notDefined(NO_VALUES);
  const counts = new Map<number, number>();
  let best = 0;
  for (const v of values) {
    const c = (counts.get(v) ?? 0) + 1;
    counts.set(v, c);
    if (c > best) best = c;
  }
  if (best === 1) return notDefined(NO_MODE);
  const result: number[] = [];
  for (const [v, c] of counts) if (c === best) result.push(v === 0 ? 0 : v);
  return defined(result.sort((a, b) => a - b));
}

/**
 * modes() of values already sorted ascending (finite, as the caller guarantees): equal values are
 * adjacent, so the counts are run lengths — one pass, no map. Same result and reasons as modes();
 * used by the fast statistics (fast/sectionFinalStatistics.ts), property-tested equal.
 */
export function modesOfSorted(sorted: ArrayLike<number>): Defined<number[]> {
  const n = sorted.length;
  if (n === 0) return notDefined(NO_VALUES);
  let best = 0;
  for (let i = 0; i < n; ) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    if (j - i > best) best = j - i;
    i = j;
  }
  if (best === 1) return notDefined(NO_MODE);
  const result: number[] = [];
  for (let i = 0; i < n; ) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    if (j - i === best) result.push(sorted[i] === 0 ? 0 : sorted[i]!);
    i = j;
  }
  return defined(result);
}
