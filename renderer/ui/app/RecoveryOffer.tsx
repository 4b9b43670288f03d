/** Offered at start when the last session left unsaved work in the recovery copy. */
import type { RecoveryInfo } from '../../bridge/contract';
import { Modal } from '../common/Modal';
import { Button } from '../common/Button';
import { formatTime } from './formatTime';

export function RecoveryOffer({ recovery, onRestore, onDiscard }: { recovery: RecoveryInfo; onRestore(): void; onDiscard(): void }) {
  const students = recovery.project.gradebook.students.length;
  return (
    <Modal title={`Restore unsaved work from ${formatTime(recovery.savedAt)}?`} onCancel={onDiscard}>
      <p>
        &ldquo;{recovery.project.title}&rdquo; ({students} {students === 1 ? 'student' : 'students'})
        {recovery.projectPath !== null ? <> — belongs to <code>{recovery.projectPath}</code></> : <> — never saved to a file</>}.
      </p>
      <p className="wb-hint">Discarding deletes the recovery copy; the project file itself is not changed.</p>
      <div className="wb-modal-actions">
        <Button onClick={onDiscard}>Discard</Button>
        <Button tone="primary" onClick={onRestore}>Restore</Button>
      </div>
    </Modal>
  );
}
