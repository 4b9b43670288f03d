/**
 * Per-assessment item analysis (classical test theory).
 *
 * - Difficulty: the mean item percent of the students who have an earned score (the classical
 *   "p-value" of an item, here as a percent; common practice). Sample SD beside it.
 * - Discrimination: the corrected item–total correlation — Pearson's r between the item percent
 *   and the *rest* of the mark, i.e. the weighted percent recomputed by the same plan with this
 *   item taken out (ungraded), so the item is not correlated with itself. "Corrected item–total
 *   correlation" is the standard name for correlating an item with the total of the other items
 *   (e.g. Nunnally & Bernstein 1994, Psychometric Theory, ch. 8 — from memory; the rule is common
 *   practice). Here "total" is the weighted percent *before* section adjustments: an adjustment
 *   shifts or scales whole sections, which would change r for reasons that have nothing to do
 *   with the item. Pairs: students with an earned score on the item and a rest mark.
 *   `itemTotal` is the uncorrected r with the full weighted percent, shown for comparison.
 * - Counts: scored, missing, excused and pending cells.
 *
 * Flags (thresholds are conventions, not laws):
 * - negative discrimination: r < 0 — stronger students did worse; check the key or the marking.
 * - low discrimination: 0 ≤ r < 0.20 — Ebel's "poor, revise" band (Ebel 1965, Measuring
 *   Educational Achievement; bands ≥ 0.40 / 0.30 / 0.20 — from memory).
 * - all full marks: every scored student earned the full points; the item separates no one.
 * - very hard: mean below 30 % (classical difficulty p < 0.30; common practice, no source).
 *
 * Cost: the course is compiled and graded once on the fast path (fast/, property-tested identical
 * to gradeCourse); each rest mark then recomputes only the category that held the item
 * (fast/weightedWithout.ts, property-tested identical to gradeCourse with planWithout), so the
 * whole analysis is O(S·(C·A + Σ items per category)) rather than one full regrade per assessment.
 */
import { compileCourse, type CompiledCourse } from '../fast/compileCourse';
import { gradeCompiled, type FastGrades } from '../fast/gradeCompiled';
import { planWithout, weightedWithout } from '../fast/weightedWithout';
import type { Gradebook, GradingPlan } from '../model';
import type { Defined } from '../defined';
import { mean } from '../stats/mean';
import { sampleSd } from '../stats/standardDeviation';
import { runSteps } from './steps';
import { pearson } from './correlation';

export const LOW_DISCRIMINATION = 0.2;
export const VERY_HARD_PERCENT = 30;

export type ItemFlagCode = 'negativeDiscrimination' | 'lowDiscrimination' | 'allFullMarks' | 'veryHard';

export interface ItemFlag {
  readonly code: ItemFlagCode;
  readonly message: string;
}

export interface ItemAnalysis {
  readonly assessmentId: string;
  readonly name: string;
  readonly possible: number;
  /** Category in the plan; null when the plan does not grade the item. */
  readonly categoryId: string | null;
  readonly extraCredit: boolean;
  readonly scored: number;
  readonly missing: number;
  readonly excused: number;
  readonly pending: number;
  /** Mean item percent of the scored students (difficulty). */
  readonly meanPercent: Defined<number>;
  /** Sample SD (n − 1) of the item percent. */
  readonly sdPercent: Defined<number>;
  /** Corrected item–total correlation (item vs the rest of the weighted percent). */
  readonly discrimination: Defined<number>;
  /** Uncorrected r of the item with the full weighted percent. */
  readonly itemTotal: Defined<number>;
  /** Students in the correlation (scored on the item and with a rest mark). */
  readonly pairs: number;
  readonly flags: readonly ItemFlag[];
}

// The plan with one assessment taken out of grading; defined beside its fast use.
export { planWithout };

function flagsFor(a: { possible: number }, percents: readonly number[], m: Defined<number>, r: Defined<number>): ItemFlag[] {
  const flags: ItemFlag[] = [];
  if (r.defined && r.value < 0) {
    flags.push({ code: 'negativeDiscrimination', message: `Negative discrimination (r = ${r.value.toFixed(2)}): students doing well elsewhere did worse here. Check the answer key and the marking.` });
  } else if (r.defined && r.value < LOW_DISCRIMINATION) {
    flags.push({ code: 'lowDiscrimination', message: `Near-zero discrimination (r = ${r.value.toFixed(2)}, below ${LOW_DISCRIMINATION}): the item hardly tells stronger from weaker students.` });
  }
  if (percents.length > 0 && percents.every((p) => p >= 100)) {
    flags.push({ code: 'allFullMarks', message: `Everyone marked got full marks (${a.possible} of ${a.possible}): the item separates no one.` });
  }
  if (m.defined && m.value < VERY_HARD_PERCENT) {
    flags.push({ code: 'veryHard', message: `Very hard: mean ${m.value.toFixed(1)} %, below ${VERY_HARD_PERCENT} %.` });
  }
  return flags;
}

/**
 * Item analysis of every assessment in gradebook order.
 * @example
 * itemAnalysis(book, plan)[0].discrimination; // => { defined: true, value: 0.41 } (say)
 */
export function itemAnalysis(book: Gradebook, plan: GradingPlan): ItemAnalysis[] {
  return runSteps(itemAnalysisSteps(book, plan));
}

/**
 * itemAnalysis in steps: the generator pauses (yields) after grading the course and after each
 * assessment, so a caller can spread the work over several tasks; run to its end it returns
 * exactly itemAnalysis(book, plan).
 */
export function* itemAnalysisSteps(book: Gradebook, plan: GradingPlan): Generator<undefined, ItemAnalysis[]> {
  const course = compileCourse(book, plan);
  const grades = gradeCompiled(course);
  yield;
  const rows: ItemAnalysis[] = [];
  for (let ai = 0; ai < book.assessments.length; ai++) {
    rows.push(analyseItem(book, plan, course, grades, ai));
    yield;
  }
  return rows;
}

function analyseItem(book: Gradebook, plan: GradingPlan, course: CompiledCourse, grades: FastGrades, ai: number): ItemAnalysis {
  const full = grades;
  const a = book.assessments[ai]!;
  const rule = plan.items[a.id];
  const rest = planWithout(plan, a.id) === plan ? full : weightedWithout(course, grades, book.assessments, a.id);
  let missing = 0;
  let excused = 0;
  let pending = 0;
  const percents: number[] = [];
  const x: number[] = [];
  const y: number[] = [];
  const xFull: number[] = [];
  const yFull: number[] = [];
  book.students.forEach((_, si) => {
    const cell = book.scores[si]?.[ai] ?? { kind: 'missing' as const };
    if (cell.kind === 'missing') missing++;
    else if (cell.kind === 'excused') excused++;
    else if (cell.kind === 'pending') pending++;
    else {
      const p = (cell.points * 100) / a.possible; // multiply first: 7 of 100 gives exactly 7
      percents.push(p);
      if (rest.hasWeighted[si] === 1) {
        x.push(p);
        y.push(rest.weighted[si]!);
      }
      if (full.hasWeighted[si] === 1) {
        xFull.push(p);
        yFull.push(full.weighted[si]!);
      }
    }
  });
  const meanPercent = mean(percents);
  const discrimination = pearson(x, y);
  return {
    assessmentId: a.id,
    name: a.name,
    possible: a.possible,
    categoryId: rule?.categoryId ?? null,
    extraCredit: rule?.extraCredit ?? false,
    scored: percents.length,
    missing,
    excused,
    pending,
    meanPercent,
    sdPercent: sampleSd(percents),
    discrimination,
    itemTotal: pearson(xFull, yFull),
    pairs: x.length,
    flags: flagsFor(a, percents, meanPercent, discrimination),
  };
}
