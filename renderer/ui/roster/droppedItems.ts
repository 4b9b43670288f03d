/**
 * Which of a student's items the drop-lowest rule leaves out — all the Roster grid needs from the
 * grading to draw a row (a struck-through cell).
 *
 * The course result has the same answer in each student's explanation lines, but reading `lines`
 * builds the student's whole explanation (every category, effective weights, adjustment,
 * rounding, letter) and keeps it for as long as the result lives: scrolling through 10 000 rows
 * built and kept all 10 000 explanations (about 48 MiB of heap, and the major garbage collections
 * that came with it, measured with bench/scrollTrace.ts --heap). Here the engine's own
 * `weighStudent` (grading/gradeCourse.ts; the one place the rule lives) runs over the categories
 * that drop anything, for that one student, and only the dropped item ids are kept.
 *
 * Equal to the item lines of gradeCourse with status 'dropped' (tests/ui/droppedItems.test.ts):
 * an item's status depends only on its own category (its waiver status and its items), so leaving
 * out the categories without a drop rule changes no status that can be 'dropped'.
 */
import { layoutFor, weighStudent, type CategoryLayout } from '../../engine/grading/gradeCourse';
import type { Gradebook, GradingPlan } from '../../engine/model';

const NONE: ReadonlySet<string> = new Set();

export interface DroppedItems {
  /** Assessment ids dropped for the student at `studentIndex` (gradebook order). */
  of(studentIndex: number): ReadonlySet<string>;
}

/**
 * One reader per (gradebook, plan). Answers are cached for the most recent `keep` students (a
 * scroll passes the same rows to the grid again and again; a memoised row needs the same set
 * object), so the cache stays small however far the grid is scrolled.
 */
export function droppedItems(book: Gradebook, plan: GradingPlan, keep = 512): DroppedItems {
  const layout: readonly CategoryLayout[] = layoutFor(book, plan).filter((l) => l.category.dropLowest > 0 && l.items.length > 0);
  if (layout.length === 0) return { of: () => NONE };
  const cache = new Map<number, ReadonlySet<string>>();
  return {
    of(studentIndex) {
      const hit = cache.get(studentIndex);
      if (hit !== undefined) return hit;
      const student = book.students[studentIndex];
      let ids: ReadonlySet<string> = NONE;
      if (student !== undefined) {
        const { lines } = weighStudent(student, book.scores[studentIndex] ?? [], layout, plan);
        const found = new Set<string>();
        for (const line of lines) if (line.kind === 'item' && line.status === 'dropped') found.add(line.assessmentId);
        if (found.size > 0) ids = found;
      }
      if (cache.size >= keep) cache.delete(cache.keys().next().value!);
      cache.set(studentIndex, ids);
      return ids;
    },
  };
}
