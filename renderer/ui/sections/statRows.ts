/**
 * The rows of the statistics table, in reading order, each with a label that says which
 * definition it is (sample vs population, the quantile method, Tukey's rule). Shared by the
 * workspace and the printable report so both show the same words.
 */
import type { Defined } from '../../engine/defined';
import type { Summary } from '../../engine/stats/describe';

export type NumericStat =
  | 'mean'
  | 'median'
  | 'min'
  | 'max'
  | 'range'
  | 'sampleVariance'
  | 'populationVariance'
  | 'sampleSd'
  | 'populationSd'
  | 'cv'
  | 'q1'
  | 'q3'
  | 'iqr'
  | 'lowerFence'
  | 'upperFence'
  | 'whiskerLow'
  | 'whiskerHigh';

export interface StatRow {
  readonly key: NumericStat;
  readonly label: string;
  /** Shown as a percent of the value (CV). */
  readonly asPercent?: boolean;
}

export function statRows(quantileMethod: string): readonly StatRow[] {
  return [
    { key: 'mean', label: 'Mean' },
    { key: 'median', label: 'Median (middle value; mean of the two middle values for even n)' },
    { key: 'min', label: 'Minimum' },
    { key: 'max', label: 'Maximum' },
    { key: 'range', label: 'Range (max − min)' },
    { key: 'sampleVariance', label: 'Sample variance (divisor n − 1)' },
    { key: 'populationVariance', label: 'Population variance (divisor n)' },
    { key: 'sampleSd', label: 'Sample standard deviation (n − 1)' },
    { key: 'populationSd', label: 'Population standard deviation (n)' },
    { key: 'cv', label: 'Coefficient of variation (sample SD ÷ mean)', asPercent: true },
    { key: 'q1', label: `Q1, first quartile (${quantileMethod})` },
    { key: 'q3', label: `Q3, third quartile (${quantileMethod})` },
    { key: 'iqr', label: 'Interquartile range (Q3 − Q1)' },
    { key: 'lowerFence', label: 'Lower fence (Q1 − 1.5·IQR, Tukey)' },
    { key: 'upperFence', label: 'Upper fence (Q3 + 1.5·IQR, Tukey)' },
    { key: 'whiskerLow', label: 'Lower whisker (lowest value inside the fences)' },
    { key: 'whiskerHigh', label: 'Upper whisker (highest value inside the fences)' },
  ];
}

export function statValue(summary: Summary, key: NumericStat): Defined<number> {
  return summary[key];
}
