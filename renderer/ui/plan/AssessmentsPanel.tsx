/** Assessments: which category each one feeds, and whether it is extra credit. */
import { itemRuleFor } from '../../engine/grading/itemRule';
import type { Gradebook, GradingPlan } from '../../engine/model';
import * as edits from '../../state/planEdits';
import { formatPoints } from '../roster/cellView';
import { CheckField, Panel, SelectField } from './fields';
import type { PlanUpdate } from './planUpdate';

const NOT_GRADED = '';

export function AssessmentsPanel({ plan, gradebook, update }: { plan: GradingPlan; gradebook: Gradebook; update: PlanUpdate }) {
  const options = [{ value: NOT_GRADED, label: 'Not graded' }, ...plan.categories.map((c) => ({ value: c.id, label: c.name }))];
  const categoryName = (id: string | null) => plan.categories.find((c) => c.id === id)?.name ?? 'not graded';
  return (
    <Panel
      id="wb-plan-assessments"
      title="Assessments"
      description="Extra credit adds its earned points to the category without adding to its points possible."
    >
      <div className="wb-table-scroll wb-table-tall">
        <table className="wb-plan-table">
          <thead>
            <tr><th scope="col">Assessment</th><th scope="col" className="wb-num">Points possible</th><th scope="col">Category</th><th scope="col">Extra credit</th></tr>
          </thead>
          <tbody>
            {gradebook.assessments.map((a) => {
              const rule = itemRuleFor(plan, a.id);
              const categoryId = rule?.categoryId ?? null;
              const known = categoryId !== null && plan.categories.some((c) => c.id === categoryId);
              return (
                <tr key={a.id} data-assessment-id={a.id}>
                  <th scope="row">{a.name}</th>
                  <td className="wb-num">{formatPoints(a.possible)}</td>
                  <td>
                    <SelectField label={`Category of ${a.name}`} hideLabel value={known ? categoryId : NOT_GRADED} options={options}
                      onChange={(v) => update(`${a.name} → ${categoryName(v === NOT_GRADED ? null : v)}`, (p) => edits.assignAssessment(p, a.id, v === NOT_GRADED ? null : v))} />
                  </td>
                  <td>
                    <CheckField label={`${a.name} is extra credit`} hideLabel checked={rule?.extraCredit ?? false}
                      onChange={(on) => update(`${a.name}: ${on ? 'extra credit' : 'regular'}`, (p) => edits.setExtraCredit(p, a.id, on))} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </Panel>
  );
}
