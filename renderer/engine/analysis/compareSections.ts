/**
 * Comparing sections, in numbers and in plain words.
 *
 * - Two sections: Welch's unequal-variances t test (Welch 1947) on the means.
 * - Three or more: Kruskal–Wallis H (Kruskal & Wallis 1952) across all sections — rank-based, so
 *   it does not assume normal marks or equal spreads.
 * - Every pair of sections: Mann–Whitney U (two-sided) and Hedges' g, the bias-corrected
 *   standardised mean difference (Hedges 1981). Size words for |g| follow Cohen's conventions
 *   0.2 small, 0.5 medium, 0.8 large (Cohen 1988, Statistical Power Analysis — from memory).
 * - With m pairwise tests, about 5 % of them fall below p = 0.05 by chance; the Bonferroni
 *   threshold 0.05/m is stated (Bonferroni correction: common practice).
 * - The caution (smallGroupCaution) is always attached: small groups make every figure unstable,
 *   and sections are not randomly assigned.
 *
 * The tests themselves live in stats/ (sources there); this module only chooses and words them.
 */
import type { Defined } from '../defined';
import { hedgesG } from '../stats/hedgesG';
import { kruskalWallis } from '../stats/kruskalWallis';
import { mannWhitneyU } from '../stats/mannWhitneyU';
import { mean } from '../stats/mean';
import { smallGroupCaution } from '../stats/smallGroupCaution';
import { welchT } from '../stats/welchT';
import { runSteps } from './steps';

export const ALPHA = 0.05;

export interface SectionGroup {
  readonly section: string;
  readonly values: readonly number[];
}

export type OverallTest =
  | { readonly kind: 'welch'; readonly a: string; readonly b: string; readonly result: Defined<{ t: number; df: number; p: number; meanDifference: number }> }
  | { readonly kind: 'kruskalWallis'; readonly result: Defined<{ h: number; df: number; p: number }> }
  | { readonly kind: 'none'; readonly reason: string };

export interface PairComparison {
  readonly a: string;
  readonly b: string;
  readonly nA: number;
  readonly nB: number;
  readonly meanA: Defined<number>;
  readonly meanB: Defined<number>;
  readonly mannWhitney: Defined<{ u: number; w: number; p: number; method: 'exact' | 'normal' }>;
  readonly hedges: Defined<{ d: number; g: number; gApprox: number; j: number; df: number }>;
  readonly sentence: string;
}

export interface SectionComparison {
  readonly overall: OverallTest;
  readonly pairs: readonly PairComparison[];
  /** Plain-words summary: the overall test first, then the multiple-comparison note. */
  readonly sentences: readonly string[];
  readonly caution: string;
  /** p below which a pairwise result survives a Bonferroni correction (ALPHA / number of pairs). */
  readonly bonferroniAlpha: number | null;
}

/** p in words people use: "p = 0.038", "p < 0.001". */
export function formatP(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

/** |g| in Cohen's size words. */
export function effectWords(g: number): 'negligible' | 'small' | 'medium' | 'large' {
  const a = Math.abs(g);
  if (a < 0.2) return 'negligible';
  if (a < 0.5) return 'small';
  if (a < 0.8) return 'medium';
  return 'large';
}

const f1 = (x: number) => x.toFixed(1);

function chance(p: number): string {
  return p < ALPHA
    ? `a difference this large would be unusual (${formatP(p)}, below ${ALPHA}) if the sections' marks came from one common pool`
    : `a difference like this could easily arise by chance (${formatP(p)}, not below ${ALPHA})`;
}

function pairSentence(pair: Omit<PairComparison, 'sentence'>): string {
  const head = `${pair.a} (n = ${pair.nA}${pair.meanA.defined ? `, mean ${f1(pair.meanA.value)}` : ''}) and ${pair.b} (n = ${pair.nB}${pair.meanB.defined ? `, mean ${f1(pair.meanB.value)}` : ''})`;
  const parts: string[] = [head + ':'];
  if (pair.meanA.defined && pair.meanB.defined) {
    const diff = pair.meanA.value - pair.meanB.value;
    parts.push(diff === 0 ? 'the means are equal.' : `${diff > 0 ? pair.a : pair.b} is ${f1(Math.abs(diff))} points higher on average.`);
  }
  if (pair.hedges.defined) {
    parts.push(`Hedges' g = ${pair.hedges.value.g.toFixed(2)}, a ${effectWords(pair.hedges.value.g)} difference.`);
  } else {
    parts.push(`No effect size: ${pair.hedges.reason}.`);
  }
  if (pair.mannWhitney.defined) {
    parts.push(`Mann–Whitney U = ${pair.mannWhitney.value.u}: ${chance(pair.mannWhitney.value.p)}.`);
  } else {
    parts.push(`No rank test: ${pair.mannWhitney.reason}.`);
  }
  return parts.join(' ');
}

function namedCaution(groups: readonly SectionGroup[]): string {
  return smallGroupCaution(groups.map((g) => g.values.length), groups.map((g) => g.section)) ?? '';
}

/**
 * @example
 * compareSections([{ section: 'A', values: [...] }, { section: 'B', values: [...] }]).overall.kind; // => 'welch'
 */
export function compareSections(groups: readonly SectionGroup[]): SectionComparison {
  return runSteps(comparisonSteps(groups));
}

/**
 * compareSections in steps: the generator pauses (yields) after the overall test and after every
 * pair, so a caller can spread the work over several tasks; run to its end it returns exactly
 * compareSections(groups). With k sections there are k·(k − 1)/2 pairs.
 */
export function* comparisonSteps(groups: readonly SectionGroup[]): Generator<undefined, SectionComparison> {
  const sentences: string[] = [];
  let overall: OverallTest;
  if (groups.length < 2) {
    overall = { kind: 'none', reason: groups.length === 0 ? 'there are no sections' : 'there is only one section; nothing to compare' };
    sentences.push(`No comparison: ${overall.reason}.`);
  } else if (groups.length === 2) {
    const [ga, gb] = groups as [SectionGroup, SectionGroup];
    const result = welchT(ga.values, gb.values);
    overall = { kind: 'welch', a: ga.section, b: gb.section, result };
    sentences.push(
      result.defined
        ? `Welch's t test on the means of ${ga.section} and ${gb.section}: t = ${result.value.t.toFixed(2)} with ${f1(result.value.df)} degrees of freedom; ${chance(result.value.p)}.`
        : `Welch's t test is not possible: ${result.reason}.`,
    );
  } else {
    const result = kruskalWallis(groups.map((g) => g.values));
    overall = { kind: 'kruskalWallis', result };
    sentences.push(
      result.defined
        ? `Kruskal–Wallis test across all ${groups.length} sections: H = ${result.value.h.toFixed(2)}, ${result.value.df} degrees of freedom; ${
            result.value.p < ALPHA
              ? `at least one section's marks sit higher or lower than the others' more than chance usually produces (${formatP(result.value.p)}).`
              : `the sections' marks do not differ more than chance alone would often produce (${formatP(result.value.p)}).`
          }`
        : `The Kruskal–Wallis test is not possible: ${result.reason}.`,
    );
  }
  yield;

  const pairs: PairComparison[] = [];
  for (let i = 0; i < groups.length; i++) {
    for (let j = i + 1; j < groups.length; j++) {
      const ga = groups[i] as SectionGroup;
      const gb = groups[j] as SectionGroup;
      const base = {
        a: ga.section,
        b: gb.section,
        nA: ga.values.length,
        nB: gb.values.length,
        meanA: mean(ga.values),
        meanB: mean(gb.values),
        mannWhitney: mannWhitneyU(ga.values, gb.values),
        hedges: hedgesG(ga.values, gb.values),
      };
      pairs.push({ ...base, sentence: pairSentence(base) });
      yield;
    }
  }
  const bonferroniAlpha = pairs.length > 1 ? ALPHA / pairs.length : null;
  if (bonferroniAlpha !== null) {
    sentences.push(
      `With ${pairs.length} pairwise comparisons, about 1 in 20 would fall below ${ALPHA} by chance alone; a pair is more convincing if its p is below ${ALPHA}/${pairs.length} = ${bonferroniAlpha.toFixed(4)} (Bonferroni).`,
    );
  }
  return { overall, pairs, sentences, caution: namedCaution(groups), bonferroniAlpha };
}
