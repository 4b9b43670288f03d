/** Grade scale (cutoffs, presets, problems), rounding rule and mark mode. */
import { useId, useState } from 'react';
import type { GradingPlan, MarkMode } from '../../engine/model';
import { SCALE_PRESETS, validateScale } from '../../engine/grading/gradeScale';
import * as edits from '../../state/planEdits';
import { Button } from '../common/Button';
import { NumberField } from '../common/NumberField';
import { CheckField, Panel, SelectField, TextCommitField } from './fields';
import type { PlanUpdate } from './planUpdate';

export function ScalePanel({ plan, update }: { plan: GradingPlan; update: PlanUpdate }) {
  const [preset, setPreset] = useState('0');
  const problems = validateScale(plan.scale);
  return (
    <Panel
      id="wb-plan-scale"
      title="Grade scale"
      description="A letter applies when the rounded final is at or above its minimum. Presets are starting points: use your institution's published scale."
    >
      <div className="wb-inline-form">
        <TextCommitField label="Scale name" value={plan.scale.name} onCommit={(name) => update(`Rename scale to ${name}`, (p) => edits.renameScale(p, name.trim()))} />
        <SelectField label="Preset" value={preset} options={SCALE_PRESETS.map((s, i) => ({ value: String(i), label: s.name }))} onChange={setPreset} />
        <Button onClick={() => {
          const chosen = SCALE_PRESETS[Number(preset)];
          if (chosen !== undefined) update(`Use the scale ${chosen.name}`, (p) => edits.setScale(p, chosen));
        }}>Use preset</Button>
      </div>
      <div className="wb-table-scroll wb-table-tall">
        <table className="wb-plan-table">
          <thead>
            <tr><th scope="col">Letter</th><th scope="col">Minimum %</th><th scope="col">Grade points</th><th scope="col">Passing</th><th scope="col"><span className="wb-visually-hidden">Actions</span></th></tr>
          </thead>
          <tbody>
            {plan.scale.cutoffs.map((c, i) => (
              <tr key={i}>
                <td><TextCommitField label={`Letter of cutoff ${i + 1}`} hideLabel value={c.letter} onCommit={(letter) => update(`Cutoff ${i + 1}: letter ${letter.trim()}`, (p) => edits.updateCutoff(p, i, { letter: letter.trim() }))} /></td>
                <td><NumberField label={`Minimum percent for ${c.letter}`} hideLabel value={c.minPercent} onCommit={(v) => update(`${c.letter}: minimum ${v ?? 0} %`, (p) => edits.updateCutoff(p, i, { minPercent: v ?? 0 }))} /></td>
                <td><NumberField label={`Grade points for ${c.letter} (blank for none)`} hideLabel allowBlank value={c.gradePoints ?? null} onCommit={(v) => update(`${c.letter}: grade points ${v ?? 'none'}`, (p) => edits.updateCutoff(p, i, { gradePoints: v ?? undefined }))} /></td>
                <td><CheckField label={`${c.letter} is a pass`} hideLabel checked={c.passing ?? false} onChange={(passing) => update(`${c.letter}: ${passing ? 'pass' : 'not a pass'}`, (p) => edits.updateCutoff(p, i, { passing }))} /></td>
                <td><Button tone="danger" aria-label={`Remove cutoff ${c.letter}`} onClick={() => update(`Remove cutoff ${c.letter}`, (p) => edits.removeCutoff(p, i))}>Remove</Button></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Button onClick={() => update('Add a cutoff', (p) => edits.addCutoff(p, { letter: `New ${p.scale.cutoffs.length + 1}`, minPercent: 0 }))}>Add cutoff</Button>
      {problems.length > 0 && (
        <div className="wb-warning" role="status" data-testid="scale-problems">
          <p><span aria-hidden="true">⚠ </span>This scale has {problems.length === 1 ? 'a problem' : `${problems.length} problems`}:</p>
          <ul>{problems.map((p) => <li key={p}>{p}</li>)}</ul>
        </div>
      )}
    </Panel>
  );
}

export function RoundingPanel({ plan, update }: { plan: GradingPlan; update: PlanUpdate }) {
  const modeName = useId();
  const modes: readonly { value: MarkMode; label: string; help: string }[] = [
    { value: 'current', label: 'Current mark', help: 'Work not yet marked is left out, and a category with nothing marked yet is left out with its weight re-normalised away: the mark so far.' },
    { value: 'projected', label: 'Projected final', help: 'Work not yet marked counts as zero, and so does a category with nothing marked: the final if nothing more is handed in.' },
  ];
  return (
    <Panel id="wb-plan-rounding" title="Rounding and mark mode">
      <SelectField
        label="Final mark rounded to"
        value={String(plan.rounding.decimals)}
        options={[0, 1, 2, 3, 4].map((d) => ({ value: String(d), label: d === 0 ? 'whole percent' : `${d} decimal${d === 1 ? '' : 's'}` }))}
        onChange={(v) => update(`Round to ${v} decimals`, (p) => edits.setRoundingDecimals(p, Number(v)))}
      />
      <p className="wb-plan-description">Rounded once, half-up, on the decimal value (89.5 becomes 90 at whole percents), before the letter is chosen.</p>
      <fieldset className="wb-mode">
        <legend>Mark mode</legend>
        {modes.map((m) => (
          <div key={m.value} className="wb-mode-option">
            <input type="radio" id={`${modeName}-${m.value}`} name={modeName} value={m.value} checked={plan.markMode === m.value}
              aria-describedby={`${modeName}-${m.value}-help`}
              onChange={() => update(`Mark mode: ${m.label.toLowerCase()}`, (p) => edits.setMarkMode(p, m.value))} />
            <label htmlFor={`${modeName}-${m.value}`}>{m.label}</label>
            <p id={`${modeName}-${m.value}-help`} className="wb-plan-description">{m.help}</p>
          </div>
        ))}
      </fieldset>
    </Panel>
  );
}
