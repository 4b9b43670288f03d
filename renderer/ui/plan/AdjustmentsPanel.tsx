/** Section adjustments (add points, scale to a target mean, cap), applied in list order before rounding. */
import { useState } from 'react';
import type { Adjustment, GradingPlan } from '../../engine/model';
import * as edits from '../../state/planEdits';
import { Button } from '../common/Button';
import { NumberField } from '../common/NumberField';
import { Panel, SelectField } from './fields';
import type { PlanUpdate } from './planUpdate';

type Kind = Adjustment['kind'];
const ALL = '\u0000all';

const KIND_OPTIONS: readonly { value: Kind; label: string }[] = [
  { value: 'addPoints', label: 'Add points' },
  { value: 'scaleToMean', label: 'Scale to a target mean' },
  { value: 'cap', label: 'Cap at' },
];

function valueOf(a: Adjustment): number {
  return a.kind === 'addPoints' ? a.points : a.kind === 'scaleToMean' ? a.targetMean : a.maxPercent;
}

function make(kind: Kind, section: string | null, value: number): Adjustment {
  switch (kind) {
    case 'addPoints': return { kind, section, points: value };
    case 'scaleToMean': return { kind, section, targetMean: value };
    case 'cap': return { kind, section, maxPercent: value };
  }
}

function describe(a: Adjustment): string {
  const who = a.section === null ? 'every section' : `section ${a.section}`;
  switch (a.kind) {
    case 'addPoints': return `Add ${a.points} points to ${who}`;
    case 'scaleToMean': return `Scale ${who} to a mean of ${a.targetMean} %`;
    case 'cap': return `Cap ${who} at ${a.maxPercent} %`;
  }
}

const VALUE_LABEL: Record<Kind, string> = { addPoints: 'Points to add', scaleToMean: 'Target mean %', cap: 'Maximum %' };

export function AdjustmentsPanel({ plan, sections, update }: { plan: GradingPlan; sections: readonly string[]; update: PlanUpdate }) {
  const [kind, setKind] = useState<Kind>('addPoints');
  const [section, setSection] = useState(ALL);
  const [value, setValue] = useState<number | null>(null);
  const sectionOptions = [{ value: ALL, label: 'All sections (as one group)' }, ...sections.map((s) => ({ value: s, label: `Section ${s}` }))];

  return (
    <Panel
      id="wb-plan-adjustments"
      title="Section adjustments"
      description="Applied to the weighted percent in this order, before rounding; each one is shown in the student's explanation. Scaling multiplies every mark in the group by target ÷ the group's mean before this step."
    >
      {plan.adjustments.length === 0 ? <p className="wb-muted">No adjustments.</p> : (
        <ol className="wb-adjustment-list">
          {plan.adjustments.map((a, i) => (
            <li key={i}>
              <span className="wb-adjustment-text">{describe(a)}</span>
              <NumberField label={`${VALUE_LABEL[a.kind]} for step ${i + 1}`} hideLabel value={valueOf(a)}
                onCommit={(v) => update(`Adjustment ${i + 1}: ${v ?? 0}`, (p) => edits.replaceAdjustment(p, i, make(a.kind, a.section, v ?? 0)))} />
              <Button tone="quiet" aria-label={`Move step ${i + 1} earlier`} disabled={i === 0} onClick={() => update(`Move adjustment ${i + 1} earlier`, (p) => edits.moveAdjustment(p, i, -1))}>↑</Button>
              <Button tone="quiet" aria-label={`Move step ${i + 1} later`} disabled={i === plan.adjustments.length - 1} onClick={() => update(`Move adjustment ${i + 1} later`, (p) => edits.moveAdjustment(p, i, 1))}>↓</Button>
              <Button tone="danger" aria-label={`Remove step ${i + 1}: ${describe(a)}`} onClick={() => update(`Remove: ${describe(a)}`, (p) => edits.removeAdjustment(p, i))}>Remove</Button>
            </li>
          ))}
        </ol>
      )}
      <div className="wb-inline-form" role="group" aria-label="Add an adjustment">
        <SelectField<Kind> label="Adjustment" value={kind} options={KIND_OPTIONS} onChange={setKind} />
        <SelectField label="Applies to" value={section} options={sectionOptions} onChange={setSection} />
        <NumberField label={VALUE_LABEL[kind]} value={value} allowBlank onCommit={setValue} />
        <Button onClick={() => {
          if (value === null) return update.fail(`Enter the ${VALUE_LABEL[kind].toLowerCase()} first.`);
          const adj = make(kind, section === ALL ? null : section, value);
          update(describe(adj), (p) => edits.addAdjustment(p, adj));
        }}>Add adjustment</Button>
      </div>
    </Panel>
  );
}
