/**
 * Course grading — the whole pipeline, in the order the syllabus reads:
 *
 *   items → category percents (categoryScore.ts, with drop lowest, extra credit, cap)
 *         → which categories count + effective weights (renormalise.ts)
 *         → weighted percent  Σ wᶜ·sᶜ / Σ wᶜ
 *         → section adjustments in list order (adjustments.ts; needs section means, hence course-level)
 *         → rounding, once, half-up on the decimal value (rounding.ts)
 *         → letter: highest cutoff ≤ rounded final (gradeScale.ts)
 *
 * Every step leaves explanation lines, in this order: for each category (plan order) its item lines
 * then its category line; the weighted line; the adjustment lines; the rounding line; the cutoff line
 * (or a no-mark line saying why there is no mark or no letter).
 */
import type { Category, Gradebook, GradingPlan, Score, Student } from '../model';
import type { CategoryLine, ExplanationLine, StudentResult } from '../results';
import { applyAdjustments, type AdjustedValues } from './adjustments';
import { categoryScore, type CategoryItem } from './categoryScore';
import { checkPlan, usableDecimals } from './checkPlan';
import { letterFor } from './gradeScale';
import { itemRuleFor } from './itemRule';
import { renormalise, waiverStatus, weightedPercent, type WeightInput } from './renormalise';
import { roundHalfUp } from './rounding';

export interface CourseResult {
  /** Index-aligned with book.students. */
  readonly students: readonly StudentResult[];
  readonly planProblems: readonly string[];
}

/** Which assessment columns feed each category, resolved once per course. */
export interface CategoryLayout {
  readonly category: Category;
  /** Assessment indices in gradebook order, with their item rule. */
  readonly items: readonly { readonly index: number; readonly id: string; readonly possible: number; readonly extraCredit: boolean }[];
}

export function layoutFor(book: Gradebook, plan: GradingPlan): readonly CategoryLayout[] {
  return plan.categories.map((category) => ({
    category,
    items: book.assessments.flatMap((a, index) => {
      const rule = itemRuleFor(plan, a.id);
      if (rule === undefined || rule.categoryId !== category.id) return [];
      if (!(Number.isFinite(a.possible) && a.possible > 0)) return [];
      return [{ index, id: a.id, possible: a.possible, extraCredit: rule.extraCredit }];
    }),
  }));
}

/** One student up to the weighted percent (before adjustments, which need the whole course). */
export interface WeighedStudent {
  readonly weighted: number | null;
  readonly effectiveWeights: Readonly<Record<string, number>>;
  readonly lines: readonly ExplanationLine[];
  /** Why there is no weighted percent (null when there is one). */
  readonly noMarkReason: string | null;
}

const MISSING: Score = { kind: 'missing' };

export function weighStudent(
  student: Student,
  row: readonly Score[],
  layout: readonly CategoryLayout[],
  plan: GradingPlan,
): WeighedStudent {
  const perCategory = layout.map(({ category, items }) => {
    let status = waiverStatus(category, student, plan.sectionWaivers, plan.studentWaivers);
    if (status !== 'counted') return { category, status, score: null };
    const cells: CategoryItem[] = items.map((it) => ({
      assessmentId: it.id,
      possible: it.possible,
      score: row[it.index] ?? MISSING,
      extraCredit: it.extraCredit,
    }));
    const score = categoryScore(category, cells, plan.markMode);
    // A category with no assessments at all is future work: zero in the projected final.
    const noColumns = items.length === 0 && plan.markMode === 'projected';
    if (!score.percent.defined && !noColumns) status = 'nothingGraded';
    return { category, status, score, noColumns };
  });

  const inputs: WeightInput[] = perCategory.map((c) => ({ weight: c.category.weight, status: c.status }));
  const percents = perCategory.map((c) => {
    if (c.status !== 'counted') return null;
    if (c.score !== null && c.score.percent.defined) return c.score.percent.value;
    return 0; // noColumns in projected mode
  });
  const effective = renormalise(inputs);
  const weighted = weightedPercent(inputs, percents);

  const lines: ExplanationLine[] = [];
  const effectiveWeights: Record<string, number> = {};
  perCategory.forEach((c, i) => {
    const eff = effective.defined ? (effective.value[i] ?? 0) : 0;
    effectiveWeights[c.category.id] = eff;
    const waived = c.status === 'droppedForCourse' || c.status === 'waivedForSection' || c.status === 'waivedForStudent';
    if (!waived && c.score !== null) lines.push(...c.score.lines);
    const percent = percents[i] ?? null;
    const uncapped = c.score !== null && c.score.uncappedPercent.defined && c.status === 'counted' ? c.score.uncappedPercent.value : percent;
    const line: CategoryLine = {
      kind: 'category',
      categoryId: c.category.id,
      status: c.status,
      combine: c.category.combine,
      percent,
      uncappedPercent: uncapped,
      capped: c.status === 'counted' && c.score !== null && c.score.capped,
      nominalWeight: c.category.weight,
      effectiveWeight: c.status === 'counted' ? eff : 0,
      contribution: percent === null || !effective.defined ? null : (eff * percent) / 100,
      dropped: c.score?.dropped ?? 0,
    };
    lines.push(line);
  });

  if (!weighted.defined || !effective.defined) {
    const reasons = perCategory.map((c) => `${c.category.name}: ${statusWords(c.status)}`).join('; ');
    const reason =
      perCategory.length === 0
        ? 'The plan has no categories.'
        : !effective.defined
          ? `No category counts for this student (${reasons}).`
          : `The categories that count have a total weight of 0 (${reasons}).`;
    return { weighted: null, effectiveWeights, lines, noMarkReason: reason };
  }
  lines.push({ kind: 'weighted', percent: weighted.value });
  return { weighted: weighted.value, effectiveWeights, lines, noMarkReason: null };
}

function statusWords(status: CategoryLine['status']): string {
  switch (status) {
    case 'counted':
      return 'counted';
    case 'droppedForCourse':
      return 'dropped for the course';
    case 'waivedForSection':
      return 'waived for the section';
    case 'waivedForStudent':
      return 'waived for the student';
    case 'nothingGraded':
      return 'nothing graded yet';
  }
}

/** Rounding and letter for one student whose adjusted value is known. */
export function finishStudent(
  student: Student,
  weighed: WeighedStudent,
  adjusted: number | null,
  adjustmentLines: readonly ExplanationLine[],
  plan: GradingPlan,
): StudentResult {
  const base = { studentId: student.id, section: student.section, effectiveWeights: weighed.effectiveWeights };
  if (weighed.weighted === null || adjusted === null || !Number.isFinite(adjusted)) {
    const reason = weighed.noMarkReason ?? 'The adjusted percent is not a number.';
    return {
      ...base,
      weighted: weighed.weighted,
      adjusted: null,
      final: null,
      letter: null,
      gradePoints: null,
      lines: [...weighed.lines, ...adjustmentLines, { kind: 'noMark', reason }],
    };
  }
  const decimals = usableDecimals(plan.rounding.decimals);
  const final = roundHalfUp(adjusted, decimals);
  const lines: ExplanationLine[] = [...weighed.lines, ...adjustmentLines, { kind: 'rounding', decimals, before: adjusted, after: final }];
  const cutoff = letterFor(final, plan.scale);
  if (cutoff === null) {
    lines.push({ kind: 'noMark', reason: `The final ${final} % is below every cutoff of the scale "${plan.scale.name}", so there is no letter.` });
  } else {
    lines.push({ kind: 'cutoff', letter: cutoff.letter, minPercent: cutoff.minPercent, gradePoints: cutoff.gradePoints ?? null });
  }
  return {
    ...base,
    weighted: weighed.weighted,
    adjusted,
    final,
    letter: cutoff?.letter ?? null,
    gradePoints: cutoff?.gradePoints ?? null,
    lines,
  };
}

/**
 * The section adjustments of the whole course (adjustments.ts), from every student's weighted
 * percent (index-aligned with book.students, null = no mark): a scale-to-mean step needs its
 * group's mean, so even one student's adjusted value depends on the others.
 */
export function adjustCourse(book: Gradebook, plan: GradingPlan, weighted: readonly (number | null)[]): AdjustedValues {
  return applyAdjustments(weighted, book.students.map((s) => s.section), plan.adjustments);
}

export function gradeCourse(book: Gradebook, plan: GradingPlan): CourseResult {
  const layout = layoutFor(book, plan);
  const weighed = book.students.map((s, i) => weighStudent(s, book.scores[i] ?? [], layout, plan));
  const adjusted = adjustCourse(book, plan, weighed.map((w) => w.weighted));
  const students = book.students.map((s, i) =>
    finishStudent(s, weighed[i]!, adjusted.values[i] ?? null, adjusted.lines[i] ?? [], plan),
  );
  return { students, planProblems: [...checkPlan(book, plan), ...adjusted.problems] };
}

/**
 * One student's result with every explanation line — exactly gradeCourse(book, plan).students[i] —
 * without grading the rest of the course: the same weighStudent and finishStudent, given the
 * course's adjustments (adjustCourse over every student's weighted percent, which a caller that
 * already holds those percents, such as the fast path, computes once and shares between students).
 * @throws {RangeError} when there is no student at `studentIndex`
 * @example
 * const adjusted = adjustCourse(book, plan, gradeCourse(book, plan).students.map((r) => r.weighted));
 * explainStudent(book, plan, layoutFor(book, plan), 3, adjusted).lines; // the lines gradeCourse gives student 3
 */
export function explainStudent(
  book: Gradebook,
  plan: GradingPlan,
  layout: readonly CategoryLayout[],
  studentIndex: number,
  adjusted: AdjustedValues,
): StudentResult {
  const student = book.students[studentIndex];
  if (student === undefined) throw new RangeError(`explainStudent: no student at index ${studentIndex}`);
  const weighed = weighStudent(student, book.scores[studentIndex] ?? [], layout, plan);
  return finishStudent(student, weighed, adjusted.values[studentIndex] ?? null, adjusted.lines[studentIndex] ?? [], plan);
}
