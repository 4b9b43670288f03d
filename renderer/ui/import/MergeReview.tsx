/** What a newer export would change in the open course, shown before anything is merged. */
import type { ReactNode } from 'react';
import type { MergePreview } from '../../bridge/contract';
import { Button } from '../common/Button';
import { Modal } from '../common/Modal';

const SHOWN = 100;

export function MergeReview({ merge, fileName, onAccept, onCancel }: { merge: MergePreview; fileName: string; onAccept(): void; onCancel(): void }) {
  const nothing = merge.addedStudents.length + merge.missingStudents.length + merge.addedAssessments.length + merge.changedScores.length === 0;
  return (
    <Modal title={`Merge ${fileName} into the open course?`} onCancel={onCancel}>
      {nothing ? (
        <p>The file holds nothing the course does not already have.</p>
      ) : (
        <div className="wb-merge">
          <MergeSection title="Students added" count={merge.addedStudents.length}>
            {merge.addedStudents.slice(0, SHOWN).map((s) => <li key={s.id}>{s.name} ({s.id}, section {s.section || '—'})</li>)}
          </MergeSection>
          <MergeSection title="Students not in the new file (kept, not deleted)" count={merge.missingStudents.length}>
            {merge.missingStudents.slice(0, SHOWN).map((s) => <li key={s.id}>{s.name} ({s.id}, section {s.section || '—'})</li>)}
          </MergeSection>
          <MergeSection title="New assessments" count={merge.addedAssessments.length}>
            {merge.addedAssessments.slice(0, SHOWN).map((a) => <li key={a}>{a}</li>)}
          </MergeSection>
          <section>
            <h3>Changed scores ({merge.changedScores.length})</h3>
            {merge.changedScores.length > 0 && (
              <table className="wb-merge-changes">
                <thead>
                  <tr><th scope="col">Student</th><th scope="col">Assessment</th><th scope="col">Before</th><th scope="col">After</th></tr>
                </thead>
                <tbody>
                  {merge.changedScores.slice(0, SHOWN).map((c) => (
                    <tr key={`${c.studentId}\u0000${c.assessmentId}`}>
                      <td>{c.studentId}</td><td>{c.assessmentId}</td><td>{c.before}</td><td>{c.after}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
            {merge.changedScores.length > SHOWN && <p className="wb-hint">…and {merge.changedScores.length - SHOWN} more.</p>}
          </section>
        </div>
      )}
      <p className="wb-hint">The grading plan is kept as it is. Merging is one step you can undo.</p>
      <div className="wb-modal-actions">
        <Button onClick={onCancel}>Cancel</Button>
        <Button tone="primary" onClick={onAccept} disabled={nothing}>Merge changes</Button>
      </div>
    </Modal>
  );
}

function MergeSection({ title, count, children }: { title: string; count: number; children: ReactNode }) {
  return (
    <section>
      <h3>{title} ({count})</h3>
      {count > 0 && <ul>{children}</ul>}
      {count > SHOWN && <p className="wb-hint">…and {count - SHOWN} more.</p>}
    </section>
  );
}
