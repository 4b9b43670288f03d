/**
 * Statistics of the final marks per section and for the course, from fast grades — the same
 * numbers as analysis/sectionStatistics.ts with describe() (and histogram(), ecdfSteps()), computed
 * with the plain statistics functions but sorting each group ONCE:
 *
 *   values (roster order, a Float64Array per group, sized by a counting pass) → sorted =
 *   sortFinals(values, decimals)   (a counting sort on the rounding grid, else the native sort);
 *   order-free statistics (quantiles, median, modes as run lengths, histogram, ECDF) read `sorted`;
 *   order-dependent ones read `values` in roster order, exactly as describe() does, so every double
 *   is the plain one: the compensated sum is simple-statistics' own `sum` called once, and the
 *   squared deviations are summed in one loop with the same operations as its
 *   sumNthPowerDeviations(x, 2) (simple-statistics 7.8, dist/simple-statistics.mjs) — describe()
 *   reaches the same two sums through mean, sampleVariance, populationVariance, both SDs and the CV,
 *   eight compensated sums and five deviation passes in all.
 *
 * describe() itself sorts a copy with a comparator (and histogram()/ecdfSteps() sort again); a typed
 * array's numeric sort is several times faster and gives the same order (finals are finite and never
 * −0). Property-tested equal to describe() in tests/engine/fast/.
 *
 * Cost O(n log n) per group for the sort plus a few O(n) passes.
 */
import { medianSorted, sum } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { coefficientOfVariation, cvOf } from '../stats/coefficientOfVariation';
import type { Summary } from '../stats/describe';
import type { EcdfStep } from '../stats/ecdf';
import { histogramOfSorted, type BinRule, type Histogram } from '../stats/histogram';
import { mean } from '../stats/mean';
import { modesOfSorted } from '../stats/modes';
import { QUANTILE_METHODS, quantileSorted, type QuantileType } from '../stats/quantile';
import { populationSd, sampleSd } from '../stats/standardDeviation';
import { tukeyFences, type Outlier } from '../stats/tukeyFences';
import { populationVariance, sampleVariance } from '../stats/variance';
import type { CompiledCourse } from './compileCourse';
import type { FastGrades } from './gradeCompiled';
import { sortFinals } from './sortFinals';

export interface GroupStatistics {
  /** Section name, or null for the whole course. */
  readonly section: string | null;
  readonly summary: Summary;
  readonly histogram: Defined<Histogram>;
  readonly ecdf: readonly EcdfStep[];
  /** Students of the group without a final mark. */
  readonly noMark: number;
}

export interface FinalStatistics {
  readonly course: GroupStatistics;
  /** Natural order of the section names ("A2" before "A10"), as sectionsOf(). */
  readonly sections: readonly GroupStatistics[];
}

export interface FinalStatisticsOptions {
  readonly quantileType?: QuantileType;
  readonly bins?: BinRule;
}

/**
 * The plain statistics functions read only `length` and indices of their input; a typed array is
 * handed to them as such a sequence, never mutated.
 */
function asSequence(xs: Float64Array): number[] {
  return xs as unknown as number[];
}

interface Moments {
  readonly mean: Defined<number>;
  readonly sampleVariance: Defined<number>;
  readonly sampleSd: Defined<number>;
  readonly populationVariance: Defined<number>;
  readonly populationSd: Defined<number>;
  readonly cv: Defined<number>;
}

/**
 * Mean, both variances and SDs and the CV of finite values in roster order, as describe() computes
 * them (see the header). n < 2 is left to the plain functions (their reasons, no cost to speak of).
 */
function momentsOf(values: readonly number[]): Moments {
  const n = values.length;
  if (n < 2) {
    return {
      mean: mean(values),
      sampleVariance: sampleVariance(values),
      sampleSd: sampleSd(values),
      populationVariance: populationVariance(values),
      populationSd: populationSd(values),
      cv: coefficientOfVariation(values),
    };
  }
  const m = sum(values) / n; // simple-statistics mean(x) = sum(x) / x.length
  let squares = 0;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const x = values[i]!;
    const d = x - m; // sumNthPowerDeviations(x, 2): tempValue = x[i] − mean; sum += tempValue²
    squares += d * d;
    maxAbs = Math.max(maxAbs, Math.abs(x));
  }
  const sv = squares / (n - 1);
  const pv = squares / n;
  const sd = Math.sqrt(sv);
  return {
    mean: defined(m),
    sampleVariance: defined(sv),
    sampleSd: defined(sd),
    populationVariance: defined(pv),
    populationSd: defined(Math.sqrt(pv)),
    cv: cvOf(m, sd, n, maxAbs),
  };
}

/**
 * describe(values, { quantileType, labels }) with the sort done once by the caller. `values` in
 * roster order (finite), `sorted` the same values ascending.
 */
export function describeWithSorted(
  values: readonly number[] | Float64Array,
  sorted: Float64Array,
  labels: readonly string[] | ((index: number) => string),
  quantileType: QuantileType,
): Summary {
  const vs = values instanceof Float64Array ? asSequence(values) : values;
  const n = vs.length;
  const none = notDefined('no values (n = 0)');
  const seq = asSequence(sorted);
  let q1: Defined<number> = none;
  let q3: Defined<number> = none;
  let iqr: Defined<number> = none;
  let lowerFence: Defined<number> = none;
  let upperFence: Defined<number> = none;
  let whiskerLow: Defined<number> = none;
  let whiskerHigh: Defined<number> = none;
  let outliers: readonly Outlier[] = [];
  let min: Defined<number> = none;
  let max: Defined<number> = none;
  let range: Defined<number> = none;
  if (n > 0) {
    const lo = quantileSorted(seq, 0.25, quantileType);
    const hi = quantileSorted(seq, 0.75, quantileType);
    const fences = tukeyFences(vs, lo, hi, labels);
    q1 = defined(lo);
    q3 = defined(hi);
    iqr = defined(hi - lo);
    lowerFence = defined(fences.lowerFence);
    upperFence = defined(fences.upperFence);
    whiskerLow = fences.whiskerLow;
    whiskerHigh = fences.whiskerHigh;
    outliers = fences.outliers;
    const first = sorted[0]!;
    const last = sorted[n - 1]!;
    min = defined(first);
    max = defined(last);
    range = defined(last - first);
  }
  const moments = momentsOf(vs);
  return {
    n,
    quantileType,
    quantileMethod: QUANTILE_METHODS[quantileType].name,
    mean: moments.mean,
    weightedMean: notDefined('no weights given'),
    median: n > 0 ? defined(medianSorted(seq)) : none,
    modes: modesOfSorted(sorted),
    min,
    max,
    range,
    sampleVariance: moments.sampleVariance,
    sampleSd: moments.sampleSd,
    populationVariance: moments.populationVariance,
    populationSd: moments.populationSd,
    cv: moments.cv,
    q1,
    q3,
    iqr,
    lowerFence,
    upperFence,
    whiskerLow,
    whiskerHigh,
    outliers,
  };
}

/** ecdfSteps() of already-sorted values. */
function ecdfStepsSorted(sorted: Float64Array): EcdfStep[] {
  const n = sorted.length;
  const steps: EcdfStep[] = [];
  for (let i = 0; i < n; i++) {
    const x = sorted[i]!;
    if (i + 1 === n || sorted[i + 1] !== x) steps.push({ x, p: (i + 1) / n });
  }
  return steps;
}

function group(
  section: string | null,
  values: Float64Array,
  labels: (index: number) => string,
  noMark: number,
  options: Required<FinalStatisticsOptions>,
  decimals: number,
): GroupStatistics {
  const sorted = sortFinals(values, decimals);
  return {
    section,
    summary: describeWithSorted(values, sorted, labels, options.quantileType),
    histogram: histogramOfSorted(asSequence(sorted), options.bins),
    ecdf: ecdfStepsSorted(sorted),
    noMark,
  };
}

/** Statistics of the rounded finals for the course and each section; outliers labelled by name. */
export function sectionFinalStatistics(course: CompiledCourse, grades: FastGrades, options: FinalStatisticsOptions = {}): FinalStatistics {
  const opts: Required<FinalStatisticsOptions> = { quantileType: options.quantileType ?? 7, bins: options.bins ?? { kind: 'sturges' } };
  const K = course.sections.length;
  const S = course.studentCount;
  const { final } = grades;
  const { sectionOf, students } = course;
  // Counting pass, then each group's values in roster order straight into its own typed array.
  const marked = new Int32Array(K);
  const noMark = new Int32Array(K);
  for (let s = 0; s < S; s++) {
    if (final[s] === final[s]) marked[sectionOf[s]!]!++;
    else noMark[sectionOf[s]!]!++;
  }
  let total = 0;
  for (let k = 0; k < K; k++) total += marked[k]!;
  const values = Array.from({ length: K }, (_, k) => new Float64Array(marked[k]!));
  const members = Array.from({ length: K }, (_, k) => new Int32Array(marked[k]!)); // student of each value
  const allValues = new Float64Array(total);
  const allMembers = new Int32Array(total);
  const fill = new Int32Array(K);
  for (let s = 0, all = 0; s < S; s++) {
    const f = final[s]!;
    if (f !== f) continue;
    const k = sectionOf[s]!;
    const i = fill[k]!++;
    values[k]![i] = f;
    members[k]![i] = s;
    allValues[all] = f;
    allMembers[all] = s;
    all++;
  }
  // Outliers are labelled by name; only they look the name up.
  const nameOf = (m: Int32Array) => (i: number): string => students[m[i]!]!.name;
  const order = course.sections
    .map((name, k) => ({ name, k }))
    .sort((a, b) => a.name.localeCompare(b.name, undefined, { numeric: true }));
  const totalNoMark = noMark.reduce((s, v) => s + v, 0);
  return {
    course: group(null, allValues, nameOf(allMembers), totalNoMark, opts, course.compiled.decimals),
    sections: order.map(({ name, k }) => group(name, values[k]!, nameOf(members[k]!), noMark[k]!, opts, course.compiled.decimals)),
  };
}
