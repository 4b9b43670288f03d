/**
 * Plan checks — problems worth telling the instructor before trusting the marks. None of them stops
 * grading: the engine has a defined behaviour for each (stated in the message), so the marks are
 * still computed and these are shown beside them.
 */
import type { Gradebook, GradingPlan } from '../model';
import { itemRuleFor } from './itemRule';
import { validateScale } from './gradeScale';

/** Weights summing to within this of 100 are "100" (2-decimal weights such as 33.33+33.33+33.34). */
const WEIGHT_TOLERANCE = 1e-6;

export function checkPlan(book: Gradebook, plan: GradingPlan): string[] {
  const problems: string[] = [];
  const categoryIds = new Set<string>();
  for (const c of plan.categories) {
    if (categoryIds.has(c.id)) problems.push(`Category id "${c.id}" is used twice; give each category its own id.`);
    categoryIds.add(c.id);
    if (!Number.isFinite(c.weight) || c.weight < 0) {
      problems.push(`Category "${c.name}" has weight ${c.weight}; weights must be 0 or more (treated as 0).`);
    }
    if (!Number.isInteger(c.dropLowest) || c.dropLowest < 0) {
      problems.push(`Category "${c.name}" drops ${c.dropLowest} items; use a whole number 0 or more (fractions are rounded down).`);
    }
    if (c.capPercent !== null && !(Number.isFinite(c.capPercent) && c.capPercent >= 0)) {
      problems.push(`Category "${c.name}" has cap ${c.capPercent}; use a percent 0 or more, or no cap.`);
    }
  }
  const live = plan.categories.filter((c) => !c.droppedForCourse);
  const total = live.reduce((s, c) => s + (Number.isFinite(c.weight) && c.weight > 0 ? c.weight : 0), 0);
  if (live.length > 0 && Math.abs(total - 100) > WEIGHT_TOLERANCE) {
    problems.push(
      `The weights of the categories in use sum to ${total}, not 100; each student's weights are re-normalised to 100 %, so check the shares are what the syllabus says.`,
    );
  }
  const assessmentIds = new Set(book.assessments.map((a) => a.id));
  const used = new Map<string, number>();
  for (const a of book.assessments) {
    const rule = itemRuleFor(plan, a.id);
    if (rule === undefined || rule.categoryId === null) {
      problems.push(`Assessment "${a.name}" is in no category, so it is not graded; assign it a category if it should count.`);
    } else if (!categoryIds.has(rule.categoryId)) {
      problems.push(`Assessment "${a.name}" names category "${rule.categoryId}", which does not exist, so it is not graded.`);
    } else {
      used.set(rule.categoryId, (used.get(rule.categoryId) ?? 0) + 1);
    }
    if (!(Number.isFinite(a.possible) && a.possible > 0)) {
      problems.push(`Assessment "${a.name}" has ${a.possible} points possible; it needs more than 0 and is left out until then.`);
    }
  }
  for (const id of Object.keys(plan.items)) {
    if (!assessmentIds.has(id)) problems.push(`The plan has a rule for assessment "${id}", which is not in the gradebook; it is ignored.`);
  }
  for (const c of plan.categories) {
    if (!c.droppedForCourse && !used.has(c.id)) {
      problems.push(`Category "${c.name}" has no assessments; it is left out of the current mark and counts as 0 in the projected final.`);
    }
  }
  const { sections, studentIds, scoreProblems } = rosterFacts(book);
  for (const w of plan.sectionWaivers) {
    if (!categoryIds.has(w.categoryId)) problems.push(`A waiver for section "${w.section}" names unknown category "${w.categoryId}".`);
    if (!sections.has(w.section)) problems.push(`A waiver names section "${w.section}", which has no students.`);
  }
  for (const w of plan.studentWaivers) {
    if (!categoryIds.has(w.categoryId)) problems.push(`A waiver for student "${w.studentId}" names unknown category "${w.categoryId}".`);
    if (!studentIds.has(w.studentId)) problems.push(`A waiver names student "${w.studentId}", who is not on the roster.`);
  }
  plan.adjustments.forEach((a, i) => {
    if (a.section !== null && !sections.has(a.section)) {
      problems.push(`Adjustment ${i + 1} names section "${a.section}", which has no students.`);
    }
    if (a.kind === 'scaleToMean' && !(a.targetMean > 0)) {
      problems.push(`Adjustment ${i + 1} scales to a mean of ${a.targetMean}; the target must be above 0.`);
    }
  });
  if (!Number.isInteger(plan.rounding.decimals) || plan.rounding.decimals < 0 || plan.rounding.decimals > 6) {
    problems.push(`Rounding to ${plan.rounding.decimals} decimals is not possible; use a whole number from 0 to 6 (0 is used).`);
  }
  problems.push(...scoreProblems);
  problems.push(...validateScale(plan.scale));
  return problems;
}

interface RosterFacts {
  readonly sections: ReadonlySet<string>;
  readonly studentIds: ReadonlySet<string>;
  /** The checks that read only the gradebook (every score cell, every row's length). */
  readonly scoreProblems: readonly string[];
}

/**
 * What checkPlan needs from the gradebook alone, once per gradebook object: a plan edit (a weight
 * typed in the Plan step) re-checks the plan, not 10 000 × 60 score cells. Gradebooks are
 * immutable (model.ts: readonly throughout; every edit makes a new one), so the object is the key.
 */
const rosterFactsOf = new WeakMap<Gradebook, RosterFacts>();

function rosterFacts(book: Gradebook): RosterFacts {
  const known = rosterFactsOf.get(book);
  if (known !== undefined) return known;
  const scoreProblems: string[] = [];
  book.scores.forEach((row, i) => {
    row.forEach((cell, j) => {
      if (cell.kind === 'earned' && !(Number.isFinite(cell.points) && cell.points >= 0)) {
        const who = book.students[i]?.id ?? `row ${i + 1}`;
        const what = book.assessments[j]?.name ?? `column ${j + 1}`;
        scoreProblems.push(`Student ${who} has ${cell.points} points on "${what}"; points must be a number 0 or more (counted as 0 until fixed).`);
      }
    });
    if (row.length !== book.assessments.length) {
      scoreProblems.push(`Gradebook row ${i + 1} has ${row.length} scores for ${book.assessments.length} assessments; absent scores are treated as missing.`);
    }
  });
  if (book.scores.length !== book.students.length) {
    scoreProblems.push(`The gradebook has ${book.students.length} students but ${book.scores.length} score rows; absent rows are treated as missing.`);
  }
  const facts: RosterFacts = {
    sections: new Set(book.students.map((s) => s.section)),
    studentIds: new Set(book.students.map((s) => s.id)),
    scoreProblems,
  };
  rosterFactsOf.set(book, facts);
  return facts;
}

/** The rounding decimals actually used: the plan's if valid, else 0 (reported by checkPlan). */
export function usableDecimals(decimals: number): number {
  return Number.isInteger(decimals) && decimals >= 0 && decimals <= 6 ? decimals : 0;
}
