/** Waivers: a category that does not count for one section, or for one student (with a note why). */
import { useMemo, useState } from 'react';
import type { Gradebook, GradingPlan } from '../../engine/model';
import * as edits from '../../state/planEdits';
import { Button } from '../common/Button';
import { Panel, SelectField, TextCommitField } from './fields';
import { StudentPicker } from './StudentPicker';
import type { PlanUpdate } from './planUpdate';

export function WaiversPanel({ plan, gradebook, sections, update }: { plan: GradingPlan; gradebook: Gradebook; sections: readonly string[]; update: PlanUpdate }) {
  const categoryName = (id: string) => plan.categories.find((c) => c.id === id)?.name ?? id;
  const categoryOptions = plan.categories.map((c) => ({ value: c.id, label: c.name }));
  // Built once per roster, not on every plan edit (10 000 entries on a large course).
  const studentById = useMemo(() => new Map(gradebook.students.map((s) => [s.id, s] as const)), [gradebook.students]);

  const [wSection, setWSection] = useState('');
  const [wSectionCategory, setWSectionCategory] = useState('');
  const [wSectionNote, setWSectionNote] = useState('');
  const [wStudent, setWStudent] = useState<number | null>(null);
  const [wStudentCategory, setWStudentCategory] = useState('');
  const [wStudentNote, setWStudentNote] = useState('');

  const sectionValue = wSection !== '' ? wSection : (sections[0] ?? '');
  const sectionCategoryValue = wSectionCategory !== '' ? wSectionCategory : (plan.categories[0]?.id ?? '');
  const studentCategoryValue = wStudentCategory !== '' ? wStudentCategory : (plan.categories[0]?.id ?? '');

  return (
    <Panel
      id="wb-plan-waivers"
      title="Waivers"
      description="A waived category does not count for that section or student; their other weights are re-normalised to 100 %."
    >
      <h3>For a section</h3>
      {plan.sectionWaivers.length === 0 ? <p className="wb-muted">No section waivers.</p> : (
        <ul className="wb-waiver-list">
          {plan.sectionWaivers.map((w) => (
            <li key={`${w.section}\u0000${w.categoryId}`} data-testid="section-waiver">
              <span><strong>{categoryName(w.categoryId)}</strong> waived for section <strong>{w.section}</strong></span>
              <TextCommitField label={`Note for the ${categoryName(w.categoryId)} waiver of section ${w.section}`} hideLabel required={false} value={w.note ?? ''}
                onCommit={(note) => update(`Note on waiver for section ${w.section}`, (p) => edits.setSectionWaiverNote(p, w.section, w.categoryId, note))} />
              <Button tone="danger" aria-label={`Remove waiver of ${categoryName(w.categoryId)} for section ${w.section}`}
                onClick={() => update(`Remove waiver of ${categoryName(w.categoryId)} for section ${w.section}`, (p) => edits.removeSectionWaiver(p, w.section, w.categoryId))}>Remove</Button>
            </li>
          ))}
        </ul>
      )}
      {plan.categories.length > 0 && sections.length > 0 && (
        <form className="wb-inline-form" aria-label="Add a section waiver"
          onSubmit={(e) => {
            e.preventDefault();
            update(`Waive ${categoryName(sectionCategoryValue)} for section ${sectionValue}`, (p) => edits.addSectionWaiver(p, sectionValue, sectionCategoryValue, wSectionNote));
            setWSectionNote('');
          }}>
          <SelectField label="Section" value={sectionValue} options={sections.map((s) => ({ value: s, label: s }))} onChange={setWSection} />
          <SelectField label="Category to waive" value={sectionCategoryValue} options={categoryOptions} onChange={setWSectionCategory} />
          <span className="wb-text-field">
            <label htmlFor="wb-section-waiver-note">Note</label>
            <input id="wb-section-waiver-note" type="text" value={wSectionNote} onChange={(e) => setWSectionNote(e.target.value)} placeholder="Why (optional)" />
          </span>
          <Button type="submit">Waive for section</Button>
        </form>
      )}

      <h3>For a student</h3>
      {plan.studentWaivers.length === 0 ? <p className="wb-muted">No student waivers.</p> : (
        <ul className="wb-waiver-list">
          {plan.studentWaivers.map((w) => {
            const s = studentById.get(w.studentId);
            const who = s === undefined ? `student ${w.studentId} (not in the roster)` : `${s.name} (${s.id})`;
            return (
              <li key={`${w.studentId}\u0000${w.categoryId}`} data-testid="student-waiver">
                <span><strong>{categoryName(w.categoryId)}</strong> waived for <strong>{who}</strong></span>
                <TextCommitField label={`Note for the ${categoryName(w.categoryId)} waiver of ${who}`} hideLabel required={false} value={w.note ?? ''}
                  onCommit={(note) => update(`Note on waiver for ${who}`, (p) => edits.setStudentWaiverNote(p, w.studentId, w.categoryId, note))} />
                <Button tone="danger" aria-label={`Remove waiver of ${categoryName(w.categoryId)} for ${who}`}
                  onClick={() => update(`Remove waiver for ${who}`, (p) => edits.removeStudentWaiver(p, w.studentId, w.categoryId))}>Remove</Button>
              </li>
            );
          })}
        </ul>
      )}
      {plan.categories.length > 0 && (
        <form className="wb-inline-form" aria-label="Add a student waiver"
          onSubmit={(e) => {
            e.preventDefault();
            const s = wStudent === null ? undefined : gradebook.students[wStudent];
            if (s === undefined) return update.fail('Choose the student the waiver is for.');
            update(`Waive ${categoryName(studentCategoryValue)} for ${s.name}`, (p) => edits.addStudentWaiver(p, s.id, studentCategoryValue, wStudentNote));
            setWStudentNote('');
          }}>
          <StudentPicker label="Student" students={gradebook.students} value={wStudent} onChange={setWStudent} />
          <SelectField label="Category to waive" value={studentCategoryValue} options={categoryOptions} onChange={setWStudentCategory} />
          <span className="wb-text-field">
            <label htmlFor="wb-student-waiver-note">Note</label>
            <input id="wb-student-waiver-note" type="text" value={wStudentNote} onChange={(e) => setWStudentNote(e.target.value)} placeholder="e.g. accommodation" />
          </span>
          <Button type="submit">Waive for student</Button>
        </form>
      )}
    </Panel>
  );
}
