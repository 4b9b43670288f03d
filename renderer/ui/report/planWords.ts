/** The grading plan and scale in plain sentences, for the printable report. */
import { sortedCutoffs } from '../../engine/grading/gradeScale';
import type { Adjustment, Gradebook, GradingPlan } from '../../engine/model';

const num = (x: number) => String(Math.round(x * 100) / 100);

export function adjustmentWords(a: Adjustment): string {
  const where = a.section === null ? 'every section' : `section ${a.section}`;
  switch (a.kind) {
    case 'addPoints':
      return `${where}: add ${num(a.points)} points to the final percent`;
    case 'scaleToMean':
      return `${where}: scale finals so the section mean becomes ${num(a.targetMean)} %`;
    case 'cap':
      return `${where}: cap finals at ${num(a.maxPercent)} %`;
  }
}

export interface PlanWords {
  readonly categories: readonly string[];
  readonly rules: readonly string[];
}

export function planWords(book: Gradebook, plan: GradingPlan): PlanWords {
  const counting = plan.categories.filter((c) => !c.droppedForCourse);
  const total = counting.reduce((s, c) => s + c.weight, 0);
  const categories = plan.categories.map((c) => {
    const items = book.assessments.filter((a) => plan.items[a.id]?.categoryId === c.id);
    const extra = items.filter((a) => plan.items[a.id]?.extraCredit === true);
    const parts = [
      `${c.name}: weight ${num(c.weight)}${c.droppedForCourse ? ' — dropped for the whole course' : total > 0 ? ` (${num((c.weight / total) * 100)} % of the final mark)` : ''}`,
      c.combine === 'totalPoints' ? 'total points (sum earned ÷ sum possible)' : 'equal items (mean of the item percents)',
      c.dropLowest > 0 ? `drop the lowest ${c.dropLowest}` : 'nothing dropped',
      c.missingAs === 'zero' ? 'missing work counts as zero' : 'missing work is left out',
      c.capPercent === null ? 'no cap' : `capped at ${num(c.capPercent)} %`,
      `${items.length} assessment${items.length === 1 ? '' : 's'}${items.length > 0 ? ` (${items.map((a) => a.name).join(', ')})` : ''}`,
    ];
    if (extra.length > 0) parts.push(`extra credit: ${extra.map((a) => a.name).join(', ')}`);
    return parts.join('; ') + '.';
  });
  const rules: string[] = [
    plan.markMode === 'current'
      ? 'Current mark: pending work and categories with nothing graded yet are left out, and the remaining weights are re-normalised to 100 %.'
      : 'Projected final: pending work and ungraded categories count as zero.',
    `The final percent is rounded once, half-up, to ${plan.rounding.decimals} decimal${plan.rounding.decimals === 1 ? '' : 's'}, before the letter is looked up.`,
  ];
  for (const w of plan.sectionWaivers) rules.push(`Waived for section ${w.section}: ${plan.categories.find((c) => c.id === w.categoryId)?.name ?? w.categoryId}${w.note ? ` (${w.note})` : ''}.`);
  if (plan.studentWaivers.length > 0) rules.push(`${plan.studentWaivers.length} individual waiver${plan.studentWaivers.length === 1 ? '' : 's'} (accommodations) for single students.`);
  for (const a of plan.adjustments) rules.push(`Adjustment, ${adjustmentWords(a)}.`);
  if (plan.adjustments.length === 0) rules.push('No section adjustments.');
  return { categories, rules };
}

export function scaleRows(plan: GradingPlan): { letter: string; minPercent: number; gradePoints: number | null }[] {
  return sortedCutoffs(plan.scale).map((c) => ({ letter: c.letter, minPercent: c.minPercent, gradePoints: c.gradePoints ?? null }));
}
