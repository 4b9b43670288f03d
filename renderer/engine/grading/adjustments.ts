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

function groupName(section: string | null): string {
  return section === null ? 'the whole course' : `section ${section}`;
}
