/**
 * The numbers behind each chart, derived from the engine's results (no statistics computed
 * here): box data from the section summaries, ECDF steps from `ecdfSteps`, bins from `histogram`,
 * letter counts from the graded results. Shared by the workspace and the printable report.
 */
import type { SectionStatistics } from '../../engine/analysis/sectionStatistics';
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import type { Gradebook, GradeScale } from '../../engine/model';
import type { StudentResult } from '../../engine/results';
import { ecdfSteps } from '../../engine/stats/ecdf';
import { histogram, type BinRule, type Histogram } from '../../engine/stats/histogram';
import type { Defined } from '../../engine/defined';
import type { BoxDatum, EcdfSeries, LetterDatum } from './charts';

/** Sections with at least one value, as box data (Q1/Q3/fences follow the summary's quantile type). */
export function boxData(stats: SectionStatistics): BoxDatum[] {
  return stats.sections.flatMap((s) => {
    const m = s.summary;
    if (!(m.q1.defined && m.q3.defined && m.median.defined && m.whiskerLow.defined && m.whiskerHigh.defined)) return [];
    return [{
      section: s.section,
      n: m.n,
      q1: m.q1.value,
      median: m.median.value,
      q3: m.q3.value,
      whiskerLow: m.whiskerLow.value,
      whiskerHigh: m.whiskerHigh.value,
      outliers: m.outliers.map((o) => ({ label: o.label, value: o.value })),
    }];
  });
}

export function ecdfData(stats: SectionStatistics): EcdfSeries[] {
  return stats.sections.filter((s) => s.values.length > 0).map((s) => ({ section: s.section, steps: ecdfSteps(s.values) }));
}

export function histogramData(values: readonly number[], rule: BinRule): Defined<Histogram> {
  return histogram(values, rule);
}

export interface LetterDistribution {
  readonly letters: readonly string[];
  readonly sections: readonly string[];
  readonly data: readonly LetterDatum[];
  /** Students with no letter (no mark), per section. */
  readonly noLetter: Readonly<Record<string, number>>;
}

/** Letters in scale order (highest cutoff first); shares are of the students with a letter. */
export function letterDistribution(book: Gradebook, results: readonly StudentResult[], scale: GradeScale, sections: readonly string[]): LetterDistribution {
  const letters = [...new Set(sortedCutoffs(scale).map((c) => c.letter))];
  // One pass over the roster: counts per section and letter.
  const counts = new Map<string, Map<string, number>>(sections.map((s) => [s, new Map(letters.map((l) => [l, 0]))]));
  const without = new Map<string, number>(sections.map((s) => [s, 0]));
  book.students.forEach((s, i) => {
    const byLetter = counts.get(s.section);
    if (byLetter === undefined) return;
    const letter = results[i]?.letter ?? null;
    if (letter === null) without.set(s.section, (without.get(s.section) ?? 0) + 1);
    else byLetter.set(letter, (byLetter.get(letter) ?? 0) + 1);
  });
  const data: LetterDatum[] = [];
  const noLetter: Record<string, number> = {};
  for (const section of sections) {
    const byLetter = counts.get(section)!;
    let withLetter = 0;
    for (const c of byLetter.values()) withLetter += c;
    noLetter[section] = without.get(section) ?? 0;
    for (const letter of letters) {
      const count = byLetter.get(letter) ?? 0;
      data.push({ section, letter, count, share: withLetter === 0 ? 0 : count / withLetter });
    }
  }
  return { letters, sections, data, noLetter };
}
