/** Categories: weights with a live sum, the per-category rules, add / rename / reorder / remove. */
import { useId, useState } from 'react';
import type { CombineRule, GradingPlan } from '../../engine/model';
import { snap15 } from '../../engine/grading/rounding';
import * as edits from '../../state/planEdits';
import { Button } from '../common/Button';
import { NumberField } from '../common/NumberField';
import { formatShare } from '../results/resultsAccess';
import { CheckField, Panel, SelectField, TextCommitField } from './fields';
import type { PlanUpdate } from './planUpdate';

const COMBINE_OPTIONS: readonly { value: CombineRule; label: string }[] = [
  { value: 'totalPoints', label: 'Total points' },
  { value: 'equalItems', label: 'Equal items' },
];
const MISSING_OPTIONS: readonly { value: 'zero' | 'excluded'; label: string }[] = [
  { value: 'zero', label: 'Zero' },
  { value: 'excluded', label: 'Left out' },
];

/** 0 … (items in the category − 1): dropping every item would leave nothing to grade. */
function dropChoices(items: number, current: number): { value: string; label: string }[] {
  const top = Math.max(current, items - 1, 0);
  return Array.from({ length: top + 1 }, (_, n) => ({ value: String(n), label: String(n) }));
}

export function CategoriesPanel({ plan, update }: { plan: GradingPlan; update: PlanUpdate }) {
  const [newName, setNewName] = useState('');
  const itemCounts = new Map<string, number>();
  for (const rule of Object.values(plan.items)) {
    if (rule.categoryId !== null && !rule.extraCredit) itemCounts.set(rule.categoryId, (itemCounts.get(rule.categoryId) ?? 0) + 1);
  }
  const newId = useId();
  const sum = snap15(edits.nominalWeightSum(plan));
  const live = plan.categories.filter((c) => !c.droppedForCourse);

  return (
    <Panel
      id="wb-plan-categories"
      title="Categories and weights"
      description="Total points: Σ earned ÷ Σ possible. Equal items: the mean of item percents. Drop lowest N keeps the subset that gives the best category percent; excused work is never counted or dropped."
    >
      <div className="wb-table-scroll">
        <table className="wb-plan-table">
          <thead>
            <tr>
              <th scope="col">Category</th>
              <th scope="col">Weight</th>
              <th scope="col">Combine</th>
              <th scope="col">Drop lowest</th>
              <th scope="col">Missing counts as</th>
              <th scope="col">Cap %</th>
              <th scope="col">Drop for course</th>
              <th scope="col"><span className="wb-visually-hidden">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {plan.categories.map((c, i) => (
              <tr key={c.id} data-category-id={c.id} className={c.droppedForCourse ? 'wb-dropped-row' : undefined}>
                <td>
                  <TextCommitField label={`Name of category ${i + 1}`} hideLabel value={c.name}
                    onCommit={(name) => update(`Rename category to ${name.trim()}`, (p) => edits.renameCategory(p, c.id, name))} />
                </td>
                <td>
                  <NumberField label={`Weight of ${c.name}`} hideLabel value={c.weight} min={0}
                    onCommit={(v) => update(`Weight of ${c.name}: ${v ?? 0}`, (p) => edits.setCategoryWeight(p, c.id, v ?? 0))} />
                </td>
                <td>
                  <SelectField label={`Combine rule of ${c.name}`} hideLabel value={c.combine} options={COMBINE_OPTIONS}
                    onChange={(combine) => update(`${c.name}: combine by ${combine === 'totalPoints' ? 'total points' : 'equal items'}`, (p) => edits.setCombineRule(p, c.id, combine))} />
                </td>
                <td>
                  <SelectField label={`Drop lowest N in ${c.name}`} hideLabel value={String(c.dropLowest)}
                    options={dropChoices(itemCounts.get(c.id) ?? 0, c.dropLowest)}
                    onChange={(v) => update(`${c.name}: drop lowest ${v}`, (p) => edits.setCategoryRules(p, c.id, { dropLowest: Number(v) }))} />
                </td>
                <td>
                  <SelectField label={`Missing work in ${c.name}`} hideLabel value={c.missingAs} options={MISSING_OPTIONS}
                    onChange={(missingAs) => update(`${c.name}: missing work ${missingAs === 'zero' ? 'counts as zero' : 'left out'}`, (p) => edits.setCategoryRules(p, c.id, { missingAs }))} />
                </td>
                <td>
                  <NumberField label={`Cap percent of ${c.name} (blank for none)`} hideLabel value={c.capPercent} min={0} allowBlank
                    onCommit={(v) => update(v === null ? `${c.name}: no cap` : `${c.name}: cap at ${v} %`, (p) => edits.setCategoryRules(p, c.id, { capPercent: v }))} />
                </td>
                <td>
                  <CheckField label={`Drop ${c.name} for the whole course`} hideLabel checked={c.droppedForCourse}
                    onChange={(droppedForCourse) => update(`${c.name}: ${droppedForCourse ? 'dropped for the course' : 'counted again'}`, (p) => edits.setCategoryRules(p, c.id, { droppedForCourse }))} />
                </td>
                <td className="wb-actions">
                  <Button tone="quiet" aria-label={`Move ${c.name} up`} disabled={i === 0} onClick={() => update(`Move ${c.name} up`, (p) => edits.moveCategory(p, c.id, -1))}>↑</Button>
                  <Button tone="quiet" aria-label={`Move ${c.name} down`} disabled={i === plan.categories.length - 1} onClick={() => update(`Move ${c.name} down`, (p) => edits.moveCategory(p, c.id, 1))}>↓</Button>
                  <Button tone="danger" aria-label={`Remove category ${c.name}`} title="Remove category" onClick={() => update(`Remove category ${c.name}`, (p) => edits.removeCategory(p, c.id))}>✕</Button>
                </td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <th scope="row">Sum in use</th>
              <td data-testid="weight-sum"><strong>{formatShare(sum)}</strong></td>
              <td colSpan={6}>
                {plan.categories.length > live.length && <span className="wb-muted">without {plan.categories.length - live.length} dropped for the course</span>}
              </td>
            </tr>
          </tfoot>
        </table>
      </div>
      {live.length > 0 && sum !== 100 && (
        <p className="wb-warning" role="status" data-testid="weight-warning">
          <span aria-hidden="true">⚠ </span>
          The weights in use sum to {formatShare(sum)}, not 100 %. Each student's weights will be re-normalised so they sum to 100 %
          — check that the resulting shares are what the syllabus says.
        </p>
      )}
      <form
        className="wb-inline-form"
        onSubmit={(e) => {
          e.preventDefault();
          if (newName.trim() === '') return update.fail('Type a name for the new category first.');
          update(`Add category ${newName.trim()}`, (p) => edits.addCategory(p, newName));
          setNewName('');
        }}
      >
        <label htmlFor={newId}>New category</label>
        <input id={newId} type="text" value={newName} onChange={(e) => setNewName(e.target.value)} placeholder="e.g. Lab reports" />
        <Button type="submit">Add category</Button>
      </form>
    </Panel>
  );
}
