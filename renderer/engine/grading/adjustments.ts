/**
 * Section adjustments of the weighted percent, applied in list order before rounding:
 *   addPoints   v' = v + points
 *   scaleToMean v' = v · T / m, m = mean of the group's values before this step (students with a mark)
 *   cap         v' = min(v, max)
 * The group is the section named, or — for `section: null` — every student in the course taken as
 * one group (so a null scaleToMean moves the course mean to T, not each section's mean).
 * A scaleToMean whose group mean is 0 or undefined changes nothing and is reported.
 * No clamping at 0 or 100 is implied: add a cap if the syllabus has one.
 *
 * Source: linear curving by an additive shift or a multiplicative factor to a target mean — common
 * practice, no source.
 */
import type { Adjustment } from '../model';
import type { AdjustmentLine } from '../results';

export interface AdjustedValues {
  /** Index-aligned with the input; null stays null. */
  readonly values: readonly (number | null)[];
  /** Per student, the adjustments that applied to them, in order. */
  readonly lines: readonly (readonly AdjustmentLine[])[];
  readonly problems: readonly string[];
}

export function applyAdjustments(
  values: readonly (number | null)[],
  sections: readonly string[],
  adjustments: readonly Adjustment[],
): AdjustedValues {
  const current = values.slice();
  const lines: AdjustmentLine[][] = values.map(() => []);
  const problems: string[] = [];
  adjustments.forEach((adj, step) => {
    const members = current
      .map((_, i) => i)
      .filter((i) => adj.section === null || sections[i] === adj.section);
    const parameter = adj.kind === 'addPoints' ? adj.points : adj.kind === 'cap' ? adj.maxPercent : adj.targetMean;
    if (!Number.isFinite(parameter)) {
      problems.push(`Adjustment ${step + 1} (${adj.kind} for ${groupName(adj.section)}) was not applied: its value is not a number.`);
      return;
    }
    let factor = 1;
    if (adj.kind === 'scaleToMean') {
      const marked = members.map((i) => current[i]).filter((v): v is number => v !== null && v !== undefined);
      const mean = marked.reduce((s, v) => s + v, 0) / marked.length;
      if (marked.length === 0 || !(mean > 0)) {
        problems.push(
          `Adjustment ${step + 1} (scale to mean ${adj.targetMean} for ${groupName(adj.section)}) was not applied: ` +
            `the group has ${marked.length === 0 ? 'no marks' : 'a mean of 0'}.`,
        );
        return;
      }
      factor = adj.targetMean / mean;
    }
    for (const i of members) {
      const before = current[i];
      if (before === null || before === undefined) continue;
      const after =
        adj.kind === 'addPoints' ? before + adj.points : adj.kind === 'cap' ? Math.min(before, adj.maxPercent) : before * factor;
      current[i] = after;
      lines[i]!.push({ kind: 'adjustment', adjustment: adj, before, after });
    }
  });
  return { values: current, lines, problems };
}

/**
 * applyAdjustments(values, sections, adjustments).values[index], without the lines, the problems
 * and the per-step arrays: the same steps in the same order, each group's mean summed in roster
 * order as above, so the double is the same (property-tested in tests/engine/grading/adjustments).
 * For callers that re-evaluate one student many times (whatIf.ts's bisection).
 *
 * Cost O(n) per scale-to-mean step, O(1) per other step; no allocation.
 */
export function adjustedValueOf(
  values: readonly (number | null)[],
  sections: readonly string[],
  adjustments: readonly Adjustment[],
  index: number,
): number | null {
  const start = values[index];
  if (start === null || start === undefined) return null;
  // The group's values change step by step; only the scale factors need them, so they are
  // tracked as a running copy only when some step scales.
  const scales = adjustments.some((a) => a.kind === 'scaleToMean');
  const current = scales ? values.slice() : null;
  let mine = start;
  for (const adj of adjustments) {
    const parameter = adj.kind === 'addPoints' ? adj.points : adj.kind === 'cap' ? adj.maxPercent : adj.targetMean;
    if (!Number.isFinite(parameter)) continue;
    const inGroup = (i: number): boolean => adj.section === null || sections[i] === adj.section;
    let factor = 1;
    if (adj.kind === 'scaleToMean') {
      let sum = 0;
      let count = 0;
      for (let i = 0; i < current!.length; i++) {
        const v = current![i];
        if (v === null || v === undefined || !inGroup(i)) continue;
        sum += v;
        count++;
      }
      const mean = sum / count;
      if (count === 0 || !(mean > 0)) continue;
      factor = adj.targetMean / mean;
    }
    const step = (before: number): number =>
      adj.kind === 'addPoints' ? before + adj.points : adj.kind === 'cap' ? Math.min(before, adj.maxPercent) : before * factor;
    if (current !== null) {
      for (let i = 0; i < current.length; i++) {
        const v = current[i];
        if (v !== null && v !== undefined && inGroup(i)) current[i] = step(v);
      }
      mine = current[index]!;
    } else if (inGroup(index)) {
      mine = step(mine);
    }
  }
  return mine;
}

function groupName(section: string | null): string {
  return section === null ? 'the whole course' : `section ${section}`;
}
