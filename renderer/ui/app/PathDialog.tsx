/**
 * File choosing where there are no native dialogs (the browser harness): the user types the full
 * path of a file on the machine that runs the harness. The services read and write that path
 * directly, exactly as they would after a native dialog.
 */
import { useId, useState } from 'react';
import { Modal } from '../common/Modal';
import { Button } from '../common/Button';
import type { PathRequest } from './frameContext';

const kindWords: Record<PathRequest['kind'], string> = {
  spreadsheet: 'a spreadsheet (.xlsx, .xls, .ods, .csv, .tsv)',
  project: 'a course project (.weighbridge)',
  export: 'the export file (.xlsx or .csv)',
  report: 'the report file (.pdf)',
};

/** True for "/home/…" and "C:\…" / "C:/…": the services accept absolute paths only. */
export function looksAbsolute(path: string): boolean {
  return path.startsWith('/') || /^[A-Za-z]:[\\/]/.test(path) || path.startsWith('\\\\');
}

export function PathDialog({ request, initialPath, onDone }: { request: PathRequest; initialPath: string; onDone(path: string | null): void }) {
  const [path, setPath] = useState(initialPath);
  const [error, setError] = useState<string | null>(null);
  const fieldId = useId();
  const hintId = useId();
  const submit = () => {
    const trimmed = path.trim();
    if (!looksAbsolute(trimmed)) {
      setError('Type the full path, starting with / (or a drive letter such as C:\\).');
      return;
    }
    onDone(trimmed);
  };
  return (
    <Modal title={request.title} onCancel={() => onDone(null)} describedBy={hintId}>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <label htmlFor={fieldId}>File path</label>
        <input
          id={fieldId}
          type="text"
          value={path}
          autoFocus
          spellCheck={false}
          aria-invalid={error !== null}
          aria-describedby={hintId}
          onChange={(e) => {
            setPath(e.target.value);
            setError(null);
          }}
        />
        <p id={hintId} className="wb-hint">
          {request.mode === 'open' ? 'Open' : 'Save'} {kindWords[request.kind]}: type its full path on the computer
          running this window&apos;s server.
        </p>
        {error !== null && <p className="wb-field-error" role="alert">{error}</p>}
        <div className="wb-modal-actions">
          <Button onClick={() => onDone(null)}>Cancel</Button>
          <Button tone="primary" type="submit">{request.mode === 'open' ? 'Open' : 'Save'}</Button>
        </div>
      </form>
    </Modal>
  );
}
