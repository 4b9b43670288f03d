/**
 * Statistics of the final marks per section and for the course, from fast grades — the same
 * numbers as analysis/sectionStatistics.ts with describe() (and histogram(), ecdfSteps()), computed
 * with the plain statistics functions but sorting each group ONCE:
 *
 *   values (roster order) → sorted = Float64Array.from(values).sort()   (native numeric sort)
 *   order-free statistics (quantiles, median, histogram, ECDF) read `sorted`;
 *   order-dependent ones (compensated mean, two-pass variances, CV, modes, outlier indices and
 *   labels) read `values`, exactly as describe() does, so every double is the plain one.
 *
 * describe() itself sorts a copy with a comparator (and histogram()/ecdfSteps() sort again); a typed
 * array's numeric sort is several times faster and gives the same order (finals are finite and never
 * −0). Property-tested equal to describe() in tests/engine/fast/.
 *
 * Cost O(n log n) per group for the sort plus O(n) per statistic.
 */
import { medianSorted } from 'simple-statistics';
import { defined, notDefined, type Defined } from '../defined';
import { coefficientOfVariation } from '../stats/coefficientOfVariation';
import type { Summary } from '../stats/describe';
import type { EcdfStep } from '../stats/ecdf';
import { histogram, type BinRule, type Histogram } from '../stats/histogram';
import { mean } from '../stats/mean';
import { modes } from '../stats/modes';
import { QUANTILE_METHODS, quantileSorted, type QuantileType } from '../stats/quantile';
import { populationSd, sampleSd } from '../stats/standardDeviation';
import { tukeyFences, type Outlier } from '../stats/tukeyFences';
import { populationVariance, sampleVariance } from '../stats/variance';
import type { CompiledCourse } from './compileCourse';
import type { FastGrades } from './gradeCompiled';

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
 * The plain statistics functions read only `length` and indices of their input; a sorted typed
 * array is handed to them as such a sequence, never mutated.
 */
function asSequence(sorted: Float64Array): number[] {
  return sorted as unknown as number[];
}

/** describe(values, { quantileType, labels }) with the sort done once by the caller. */
export function describeWithSorted(
  values: readonly number[],
  sorted: Float64Array,
  labels: readonly string[],
  quantileType: QuantileType,
): Summary {
  const n = values.length;
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
    const fences = tukeyFences(values, lo, hi, labels);
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
  return {
    n,
    quantileType,
    quantileMethod: QUANTILE_METHODS[quantileType].name,
    mean: mean(values),
    weightedMean: notDefined('no weights given'),
    median: n > 0 ? defined(medianSorted(seq)) : none,
    modes: modes(values),
    min,
    max,
    range,
    sampleVariance: sampleVariance(values),
    sampleSd: sampleSd(values),
    populationVariance: populationVariance(values),
    populationSd: populationSd(values),
    cv: coefficientOfVariation(values),
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
  values: number[],
  labels: string[],
  noMark: number,
  options: Required<FinalStatisticsOptions>,
): GroupStatistics {
  const sorted = Float64Array.from(values).sort();
  const seq = asSequence(sorted);
  return {
    section,
    summary: describeWithSorted(values, sorted, labels, options.quantileType),
    // histogram() sorts its input again; already sorted, that is one linear pass.
    histogram: histogram(seq, options.bins),
    ecdf: ecdfStepsSorted(sorted),
    noMark,
  };
}

/** Statistics of the rounded finals for the course and each section; outliers labelled by name. */
export function sectionFinalStatistics(course: CompiledCourse, grades: FastGrades, options: FinalStatisticsOptions = {}): FinalStatistics {
  const opts: Required<FinalStatisticsOptions> = { quantileType: options.quantileType ?? 7, bins: options.bins ?? { kind: 'sturges' } };
  const K = course.sections.length;
  const values: number[][] = Array.from({ length: K }, () => []);
  const labels: string[][] = Array.from({ length: K }, () => []);
  const noMark = new Int32Array(K);
  const allValues: number[] = [];
  const allLabels: string[] = [];
  const { final } = grades;
  for (let s = 0; s < course.studentCount; s++) {
    const k = course.sectionOf[s]!;
    const f = final[s]!;
    if (f !== f) {
      noMark[k]!++;
      continue;
    }
    const name = course.students[s]!.name;
    values[k]!.push(f);
    labels[k]!.push(name);
    allValues.push(f);
    allLabels.push(name);
  }
  const order = course.sections
    .map((name, k) => ({ name, k }))
    .sort((a, b) => a.name.localeCompare(b.name, undefined, { numeric: true }));
  const totalNoMark = noMark.reduce((s, v) => s + v, 0);
  return {
    course: group(null, allValues, allLabels, totalNoMark, opts),
    sections: order.map(({ name, k }) => group(name, values[k]!, labels[k]!, noMark[k]!, opts)),
  };
}
