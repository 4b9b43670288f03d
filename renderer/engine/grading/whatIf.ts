/**
 * What-if: what a student needs on the work still pending, and who sits just below a cutoff.
 *
 * neededOnPending: for each cutoff, the smallest uniform percent t (the same t on every pending item
 * of the student) for which the PROJECTED final — pending items scored t % instead of 0, every other
 * rule unchanged, the whole course re-graded so section adjustments see the new mean — reaches the
 * cutoff's minimum. The final is non-decreasing in t (every step of the pipeline is: kept-subset
 * ratios, means, min, weighted means, v·T·n/(S+v), half-up rounding), so t is found by bisection on
 * the grid of 0.01 %: the answer t reaches the cutoff and t − 0.01 does not. t is searched in 0…100.
 *   reached        — the projected final (pending counted as 0) already reaches it; needed = 0
 *   noPendingWork  — not reached and nothing is pending in a category that counts
 *   unreachable    — even 100 % on every pending item falls short
 *   reachable      — needed = t
 *
 * boundaryList: students whose final is below the next cutoff up by at most `within` points,
 * closest first (gap = nextMin − final, rounded half-up to 9 decimals to remove float noise).
 *
 * Source: solving a monotone step function by bisection — standard numerical method; "what do I need
 * on the rest" — common practice, no source.
 */
import type { GradeScale, Gradebook, GradingPlan, Score } from '../model';
import type { StudentResult } from '../results';
import { defined, notDefined, type Defined } from '../defined';
import { adjustedValueOf } from './adjustments';
import { usableDecimals } from './checkPlan';
import { layoutFor, weighStudent } from './gradeCourse';
import { sortedCutoffs } from './gradeScale';
import { waiverStatus } from './renormalise';
import { roundHalfUp } from './rounding';

export interface NeededForCutoff {
  readonly letter: string;
  readonly minPercent: number;
  readonly status: 'reached' | 'reachable' | 'unreachable' | 'noPendingWork';
  readonly neededPercent: Defined<number>;
}

export interface BoundaryEntry {
  readonly studentId: string;
  readonly section: string;
  readonly final: number;
  readonly letter: string | null;
  readonly nextLetter: string;
  readonly nextMin: number;
  readonly gap: number;
}

/** Grid steps per percent: answers are multiples of 0.01 %. */
const STEPS_PER_PERCENT = 100;
const TOP = 100 * STEPS_PER_PERCENT;

/**
 * What the student needs on pending work for each cutoff (see the header). `othersWeighted`: every
 * student's projected weighted percent (fast/projectedWeighted.ts), for a caller that shows several
 * students of one course and computes it once; computed here with the plain engine when absent.
 * @throws {RangeError} when there is no student at `studentIndex`
 */
export function neededOnPending(
  book: Gradebook,
  plan: GradingPlan,
  studentIndex: number,
  othersWeighted?: readonly (number | null)[],
): readonly NeededForCutoff[] {
  const student = book.students[studentIndex];
  if (student === undefined) throw new RangeError(`neededOnPending: no student at index ${studentIndex}`);
  const projected: GradingPlan = { ...plan, markMode: 'projected' };
  const layout = layoutFor(book, projected);
  const others =
    othersWeighted !== undefined && othersWeighted.length === book.students.length
      ? othersWeighted
      : book.students.map((s, i) => weighStudent(s, book.scores[i] ?? [], layout, projected).weighted);
  const sections = book.students.map((s) => s.section);
  const row = book.scores[studentIndex] ?? [];
  const decimals = usableDecimals(plan.rounding.decimals);

  const pending = layout
    .filter((c) => waiverStatus(c.category, student, plan.sectionWaivers, plan.studentWaivers) === 'counted')
    .flatMap((c) => c.items)
    .filter((it) => row[it.index]?.kind === 'pending');

  const cache = new Map<number, number | null>();
  const finalAt = (step: number): number | null => {
    const hit = cache.get(step);
    if (hit !== undefined) return hit;
    const filled: Score[] = row.slice();
    for (const it of pending) filled[it.index] = { kind: 'earned', points: (step * it.possible) / TOP };
    const values = others.slice();
    values[studentIndex] = weighStudent(student, filled, layout, projected).weighted;
    const adjusted = adjustedValueOf(values, sections, plan.adjustments, studentIndex);
    const final = adjusted === null || !Number.isFinite(adjusted) ? null : roundHalfUp(adjusted, decimals);
    cache.set(step, final);
    return final;
  };
  const reaches = (step: number, min: number): boolean => {
    const f = finalAt(step);
    return f !== null && f >= min;
  };

  return sortedCutoffs(plan.scale).map((c): NeededForCutoff => {
    const base = { letter: c.letter, minPercent: c.minPercent };
    if (reaches(0, c.minPercent)) return { ...base, status: 'reached', neededPercent: defined(0) };
    if (pending.length === 0) {
      return { ...base, status: 'noPendingWork', neededPercent: notDefined('nothing is pending for this student') };
    }
    if (!reaches(TOP, c.minPercent)) {
      const best = finalAt(TOP);
      return {
        ...base,
        status: 'unreachable',
        neededPercent: notDefined(`even 100 % on all pending work gives ${best === null ? 'no mark' : `${best} %`}`),
      };
    }
    let lo = 0; // fails
    let hi = TOP; // reaches
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (reaches(mid, c.minPercent)) hi = mid;
      else lo = mid;
    }
    return { ...base, status: 'reachable', neededPercent: defined(hi / STEPS_PER_PERCENT) };
  });
}

export function boundaryList(results: readonly StudentResult[], scale: GradeScale, within: number): readonly BoundaryEntry[] {
  const ascending = sortedCutoffs(scale).slice().reverse();
  const entries: BoundaryEntry[] = [];
  for (const r of results) {
    if (r.final === null) continue;
    const final = r.final;
    const next = ascending.find((c) => c.minPercent > final);
    if (next === undefined) continue;
    // The float difference carries the operands' error (80 − 79.9 = 0.09999999999999432): snap to
    // 9 decimals, far finer than any final or cutoff is written.
    const gap = roundHalfUp(next.minPercent - final, 9);
    if (gap <= within) {
      entries.push({
        studentId: r.studentId,
        section: r.section,
        final,
        letter: r.letter,
        nextLetter: next.letter,
        nextMin: next.minPercent,
        gap,
      });
    }
  }
  return entries.sort(
    (a, b) => a.gap - b.gap || byCode(a.section, b.section) || byCode(a.studentId, b.studentId),
  );
}

/** Code-unit order: the same on every machine, unlike locale collation. */
function byCode(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
