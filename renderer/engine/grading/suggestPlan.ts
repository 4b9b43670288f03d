/**
 * A starting plan guessed from assessment names, for the CLI's init-plan and the first start.
 *
 *   1. Base name = the assessment name without a trailing number ("Quiz 3", "HW03", "Lab #2",
 *      "Essay (2)" → "Quiz", "HW", "Lab", "Essay").
 *   2. Base names containing a well-known word join a trade category: quiz → Quizzes;
 *      exam/midterm/final/test → Exams; homework/hw/assignment/problem set/exercise → Homework;
 *      lab/practical → Labs; project → Projects (checked first, so "Final project" is a project). Others form a category named after the base name.
 *   3. Every category: equal weights summing to 100 (two decimals, the remainder on the last),
 *      total points, no drops, missing counts as zero, no cap.
 *   4. Letter scale with + and − (gradeScale.ts), rounding to 0 decimals (whole percent, as cutoffs
 *      are usually whole percents), current mark.
 * Extra credit is never guessed. The instructor must review all of it against the syllabus.
 * Source: the category words are common practice, no source.
 */
import type { Category, Gradebook, GradingPlan, ItemRule } from '../model';
import { DEFAULT_SCALE } from './gradeScale';

const TRADE_CATEGORIES: readonly { readonly name: string; readonly pattern: RegExp }[] = [
  // Projects first, so "Final project" is a project and "Final exam" an exam.
  { name: 'Projects', pattern: /\bproject/i },
  { name: 'Quizzes', pattern: /\bquiz/i },
  { name: 'Exams', pattern: /\b(exam|midterm|mid-term|final|test)/i },
  { name: 'Homework', pattern: /\b(homework|hw|assignment|problem set|pset|exercise)/i },
  { name: 'Labs', pattern: /\b(lab|practical)/i },
];

/** "Quiz 3" → "Quiz"; "HW03" → "HW"; "Lab #2" → "Lab"; "Essay (2)" → "Essay"; "Midterm" → "Midterm". */
export function baseName(name: string): string {
  const stripped = name.trim().replace(/[\s_#.:-]*\(?\d+[a-z]?\)?$/i, '').trim();
  return stripped === '' ? name.trim() : stripped;
}

export function categoryNameFor(assessmentName: string): string {
  const base = baseName(assessmentName);
  return TRADE_CATEGORIES.find((c) => c.pattern.test(base))?.name ?? base;
}

export function suggestPlan(book: Gradebook): GradingPlan {
  const order: string[] = [];
  const byName = new Map<string, string[]>();
  for (const a of book.assessments) {
    const name = categoryNameFor(a.name);
    const key = name.toLowerCase();
    if (!byName.has(key)) {
      byName.set(key, []);
      order.push(name);
    }
    byName.get(key)!.push(a.id);
  }
  const weights = equalWeights(order.length);
  const ids = new Set<string>();
  const itemEntries: [string, ItemRule][] = [];
  const categories: Category[] = order.map((name, i) => {
    const id = uniqueId(slug(name), ids);
    for (const assessmentId of byName.get(name.toLowerCase()) ?? []) itemEntries.push([assessmentId, { categoryId: id, extraCredit: false }]);
    return {
      id,
      name,
      weight: weights[i] ?? 0,
      combine: 'totalPoints',
      dropLowest: 0,
      missingAs: 'zero',
      capPercent: null,
      droppedForCourse: false,
    };
  });
  return {
    categories,
    items: Object.fromEntries(itemEntries),
    sectionWaivers: [],
    studentWaivers: [],
    markMode: 'current',
    scale: DEFAULT_SCALE,
    rounding: { decimals: 0 },
    adjustments: [],
  };
}

/** n weights of two decimals summing to exactly 100 in decimal (last takes the remainder). */
export function equalWeights(n: number): number[] {
  if (n <= 0) return [];
  const hundredths = 10_000;
  const each = Math.floor(hundredths / n);
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? hundredths - each * (n - 1) : each) / 100);
}

function slug(name: string): string {
  const s = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  return s === '' ? 'category' : s;
}

function uniqueId(base: string, taken: Set<string>): string {
  let id = base;
  for (let k = 2; taken.has(id); k++) id = `${base}-${k}`;
  taken.add(id);
  return id;
}
