/**
 * Explanation sentences — one plain-English sentence per explanation line, shared by the Results
 * screen, the CLI and the export so a mark reads the same everywhere. Numbers are shown with at most
 * two decimals (half-up, rounding.ts); the computed values themselves are never rounded here.
 */
import type { Adjustment } from '../model';
import type { ExplanationLine, ItemLine } from '../results';
import { roundHalfUp } from './rounding';

export interface LineNames {
  category(id: string): string;
  assessment(id: string): string;
}

/** At most two decimals, no trailing zeros: 83.33333 → "83.33", 90 → "90". */
export function formatNumber(x: number, decimals = 2): string {
  return String(roundHalfUp(x, decimals));
}

export function describeLine(line: ExplanationLine, names: LineNames): string {
  switch (line.kind) {
    case 'item':
      return describeItem(line, names);
    case 'category': {
      const name = names.category(line.categoryId);
      switch (line.status) {
        case 'droppedForCourse':
          return `${name} is dropped for the whole course, so its weight goes to the other categories.`;
        case 'waivedForSection':
          return `${name} is waived for this section, so its weight goes to the other categories.`;
        case 'waivedForStudent':
          return `${name} is waived for this student, so its weight goes to the other categories.`;
        case 'nothingGraded':
          return `${name} has nothing graded yet, so it is left out and its weight goes to the other categories.`;
        case 'counted': {
          const rule = line.combine === 'totalPoints' ? 'total points' : 'the mean of item percents';
          const dropped = line.dropped > 0 ? `, after dropping ${line.dropped} item${line.dropped === 1 ? '' : 's'}` : '';
          const cap =
            line.capped && line.uncappedPercent !== null
              ? ` (${formatNumber(line.uncappedPercent)} %, capped)`
              : '';
          const pct = line.percent === null ? 'no score' : `${formatNumber(line.percent)} %${cap}`;
          const contribution = line.contribution === null ? '' : `, adding ${formatNumber(line.contribution)} points to the mark`;
          return (
            `${name} scores ${pct} by ${rule}${dropped}; weight ${formatNumber(line.nominalWeight)} ` +
            `becomes ${formatNumber(line.effectiveWeight)} % of the mark${contribution}.`
          );
        }
      }
      break;
    }
    case 'weighted':
      return `The weighted percent is ${formatNumber(line.percent, 4)} %.`;
    case 'adjustment':
      return `${describeAdjustment(line.adjustment)} takes ${formatNumber(line.before, 4)} % to ${formatNumber(line.after, 4)} %.`;
    case 'rounding':
      return `Rounded half-up to ${line.decimals} decimal${line.decimals === 1 ? '' : 's'}: ${formatNumber(line.before, 4)} % becomes ${line.after} %.`;
    case 'cutoff': {
      const points = line.gradePoints === null ? '' : ` (${line.gradePoints} grade points)`;
      return `That is at or above the ${line.minPercent} % cutoff for ${line.letter}${points}.`;
    }
    case 'noMark':
      return line.reason;
  }
  return '';
}

function describeItem(line: ItemLine, names: LineNames): string {
  const name = names.assessment(line.assessmentId);
  const pts = (earned: number | null): string =>
    earned === null ? '' : `${formatNumber(earned)} of ${formatNumber(line.possible)} points (${formatNumber((100 * earned) / line.possible)} %)`;
  switch (line.status) {
    case 'counted':
      return `${name}: ${pts(line.earned)}, counted.`;
    case 'dropped':
      return `${name}: ${pts(line.earned)}, dropped by the drop-lowest rule.`;
    case 'excused':
      return `${name}: excused, so it is not counted at all.`;
    case 'missingZero':
      return `${name}: missing, counted as 0 of ${formatNumber(line.possible)} points.`;
    case 'missingExcluded':
      return `${name}: missing, left out by this category's rule.`;
    case 'pendingExcluded':
      return `${name}: not marked yet, left out of the current mark.`;
    case 'pendingZero':
      return `${name}: not marked yet, counted as 0 of ${formatNumber(line.possible)} points in the projected final.`;
    case 'extraCredit':
      return `${name}: extra credit, ${formatNumber(line.earned ?? 0)} points added to the category without adding to its points possible.`;
  }
}

function describeAdjustment(a: Adjustment): string {
  const who = a.section === null ? 'the whole course' : `section ${a.section}`;
  switch (a.kind) {
    case 'addPoints':
      return `Adding ${formatNumber(a.points)} points for ${who}`;
    case 'scaleToMean':
      return `Scaling ${who} so its mean becomes ${formatNumber(a.targetMean)} %`;
    case 'cap':
      return `Capping ${who} at ${formatNumber(a.maxPercent)} %`;
  }
}
