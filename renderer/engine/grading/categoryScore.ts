/**
 * Category score — one student's items in one category → one percent.
 *
 *   totalPoints:  s = 100 · (Σ_kept e + Σ_extra e) / Σ_kept p
 *   equalItems:   s = mean_kept(100 · e/p) + 100 · Σ_extra e / Σ_kept p
 *   then, when the category has a cap: s = min(s, cap).
 *
 * Which items are "kept" (the denominator set):
 *   - earned work is counted;
 *   - missing work counts as 0 (`missingAs: 'zero'`) or is left out (`'excluded'`);
 *   - pending work is left out in the current mark and counts as 0 in the projected final;
 *   - excused work never counts and is never dropped (as if the item did not exist);
 *   - then drop lowest N (see dropLowest.ts) removes N of the counted regular items, never all.
 * Extra-credit items add their earned points to the numerator only, are never dropped, and never
 * count as zero (a missing bonus simply adds nothing).
 *
 * Extra credit under equal items (our decision): the bonus points are expressed as a percent of the
 * kept items' total possible, i.e. exactly what they add under total points; with equal-sized items
 * the two rules therefore agree. Source for "extra credit adds to the numerator only": common
 * practice, no source.
 *
 * Nothing to count (every regular item excused / left out / pending in the current mark) → the percent
 * is not defined and the category does not count for the student (renormalise.ts), even if extra credit
 * was earned — there is no denominator to add it to.
 */
import type { Category, MarkMode, Score } from '../model';
import type { ItemLine, ItemStatus } from '../results';
import { defined, notDefined, type Defined } from '../defined';
import { dropForTotalPoints, dropLowestPercents, type DropCandidate } from './dropLowest';

export interface CategoryItem {
  readonly assessmentId: string;
  readonly possible: number;
  readonly score: Score;
  readonly extraCredit: boolean;
}

export interface CategoryScore {
  /** After the cap. */
  readonly percent: Defined<number>;
  readonly uncappedPercent: Defined<number>;
  readonly capped: boolean;
  /** One line per item, in the order given. */
  readonly lines: readonly ItemLine[];
  readonly dropped: number;
}

export function categoryScore(category: Category, items: readonly CategoryItem[], mode: MarkMode): CategoryScore {
  const statuses: ItemStatus[] = items.map((it) => initialStatus(it, category, mode));

  // Regular items in the denominator set, before dropping.
  const candidates: number[] = [];
  statuses.forEach((st, i) => {
    if (st === 'counted' || st === 'missingZero' || st === 'pendingZero') candidates.push(i);
  });
  const dropInput: DropCandidate[] = candidates.map((i) => ({ earned: earnedOf(items[i]!), possible: items[i]!.possible }));
  const choice =
    category.combine === 'totalPoints'
      ? dropForTotalPoints(dropInput, category.dropLowest)
      : dropLowestPercents(dropInput, category.dropLowest);
  for (const d of choice.dropped) statuses[candidates[d]!] = 'dropped';
  const kept = choice.kept.map((k) => items[candidates[k]!]!);

  const lines: ItemLine[] = items.map((it, i) => itemLine(it, category.id, statuses[i]!));

  if (kept.length === 0) {
    const why = notDefined(`nothing graded yet in ${category.name}`);
    return { percent: why, uncappedPercent: why, capped: false, lines, dropped: choice.dropped.length };
  }
  const extra = items.reduce((s, it, i) => (statuses[i] === 'extraCredit' ? s + earnedOf(it) : s), 0);
  const keptPossible = kept.reduce((s, it) => s + it.possible, 0);
  const base =
    category.combine === 'totalPoints'
      ? (100 * kept.reduce((s, it) => s + earnedOf(it), 0)) / keptPossible
      : kept.reduce((s, it) => s + (100 * earnedOf(it)) / it.possible, 0) / kept.length;
  const uncapped = base + (100 * extra) / keptPossible;
  const cap = category.capPercent;
  const capped = cap !== null && uncapped > cap;
  return {
    percent: defined(capped ? cap : uncapped),
    uncappedPercent: defined(uncapped),
    capped,
    lines,
    dropped: choice.dropped.length,
  };
}

/**
 * Earned points of a cell; 0 for cells without points. Points that are not a number or negative
 * (refused by the parser, possible only in a hand-edited project) also count as 0 — checkPlan.ts
 * reports each such cell.
 */
function earnedOf(item: CategoryItem): number {
  if (item.score.kind !== 'earned') return 0;
  const p = item.score.points;
  return Number.isFinite(p) && p > 0 ? p : 0;
}

function initialStatus(item: CategoryItem, category: Category, mode: MarkMode): ItemStatus {
  switch (item.score.kind) {
    case 'excused':
      return 'excused';
    case 'earned':
      return item.extraCredit ? 'extraCredit' : 'counted';
    case 'missing':
      return item.extraCredit || category.missingAs === 'excluded' ? 'missingExcluded' : 'missingZero';
    case 'pending':
      return item.extraCredit || mode === 'current' ? 'pendingExcluded' : 'pendingZero';
  }
}

/**
 * Item line. `earned` is the points entering the numerator; for a dropped item it holds the points
 * it had (status 'dropped' says they do not enter), so the explanation can show what was dropped.
 */
function itemLine(item: CategoryItem, categoryId: string, status: ItemStatus): ItemLine {
  let earned: number | null;
  if (status === 'counted' || status === 'extraCredit' || status === 'dropped') {
    earned = earnedOf(item);
  } else if (status === 'missingZero' || status === 'pendingZero') {
    earned = 0;
  } else {
    earned = null;
  }
  return {
    kind: 'item',
    assessmentId: item.assessmentId,
    categoryId,
    status,
    earned,
    possible: item.possible,
    percent: earned === null ? null : (100 * earned) / item.possible,
  };
}
