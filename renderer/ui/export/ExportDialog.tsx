/**
 * Export final marks: format, columns (chosen, ordered, headers editable), optional extra sheets,
 * a preview of the first rows, the target path, and the overwrite question when the file exists.
 * The file is written by the main process (bridge.exportFinals), never here.
 */
import { useId, useMemo, useState } from 'react';
import { useBridge } from '../../bridge/BridgeContext';
import type { ExportFormat } from '../../bridge/contract';
import { useCourseStore } from '../../state/courseStore';
import { Button } from '../common/Button';
import { Modal } from '../common/Modal';
import { chosenColumns, defaultColumns, EXPORT_CAUTION, FIELD_NAMES, move, previewRows, suggestedExportName, withExtension, type ColumnChoice } from './exportColumns';
import './export.css';

type Status =
  | { kind: 'idle' }
  | { kind: 'writing' }
  | { kind: 'confirmOverwrite'; message: string }
  | { kind: 'done'; path: string; rows: number }
  | { kind: 'failed'; message: string };

export function ExportDialog({ onClose }: { onClose(): void }) {
  const bridge = useBridge();
  const { project, projectPath, results } = useCourseStore();
  const hasPoints = project?.plan.scale.cutoffs.some((c) => c.gradePoints !== undefined) ?? false;
  const [format, setFormat] = useState<ExportFormat>('xlsx');
  const [columns, setColumns] = useState<ColumnChoice[]>(() => defaultColumns(hasPoints));
  const [include, setInclude] = useState({ breakdown: false, sectionStatistics: false, assessmentStatistics: false });
  const [path, setPath] = useState('');
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const ids = { caution: useId(), path: useId(), preview: useId() };

  const chosen = useMemo(() => chosenColumns(columns), [columns]);
  const preview = useMemo(
    () => (project === null || results === null ? [] : previewRows(project.gradebook, results.students, chosen)),
    [project, results, chosen],
  );
  if (project === null) return null;

  const update = (i: number, patch: Partial<ColumnChoice>) => setColumns((cs) => cs.map((c, k) => (k === i ? { ...c, ...patch } : c)));
  const emptyHeader = columns.some((c) => c.included && c.header.trim() === '');
  const canWrite = chosen.length > 0 && !emptyHeader && path.trim() !== '' && status.kind !== 'writing';

  const choose = async () => {
    const r = await bridge.chooseSavePath('export', suggestedExportName(project.title, format));
    if (!r.ok) setStatus({ kind: 'failed', message: r.message });
    else if (r.value !== null) setPath(r.value);
  };

  const write = async (overwrite: boolean) => {
    setStatus({ kind: 'writing' });
    const r = await bridge.exportFinals({ path: path.trim(), format, project, projectPath, columns: chosen, include, overwrite });
    if (r.ok) setStatus({ kind: 'done', path: r.value.path, rows: r.value.rows });
    else if (r.code === 'exists' && !overwrite) setStatus({ kind: 'confirmOverwrite', message: r.message });
    else setStatus({ kind: 'failed', message: r.message });
  };

  const extras: { key: keyof typeof include; label: string }[] = [
    { key: 'breakdown', label: 'Per-student breakdown (every explanation line)' },
    { key: 'sectionStatistics', label: 'Section statistics' },
    { key: 'assessmentStatistics', label: 'Assessment statistics' },
  ];

  return (
    <Modal title="Export final marks" onCancel={onClose} describedBy={ids.caution}>
      <p id={ids.caution} className="wb-caution wb-export-caution" role="note">{EXPORT_CAUTION}</p>

      <fieldset className="wb-export-group">
        <legend>Format</legend>
        {(['xlsx', 'csv'] as const).map((f) => (
          <label key={f} className="wb-inline">
            <input type="radio" name="wb-export-format" value={f} checked={format === f} onChange={() => { setFormat(f); setPath((p) => withExtension(p, f)); }} />
            {f === 'xlsx' ? 'Excel workbook (.xlsx)' : 'Comma-separated text (.csv, UTF-8)'}
          </label>
        ))}
      </fieldset>

      <fieldset className="wb-export-group">
        <legend>Columns, in file order</legend>
        <table className="wb-export-columns">
          <thead><tr><th scope="col">Include</th><th scope="col">Field</th><th scope="col">Header in the file</th><th scope="col">Order</th></tr></thead>
          <tbody>
            {columns.map((c, i) => (
              <tr key={c.field} data-field={c.field}>
                <td><input type="checkbox" checked={c.included} onChange={(e) => update(i, { included: e.target.checked })} aria-label={`Include ${FIELD_NAMES[c.field]}`} /></td>
                <td>{FIELD_NAMES[c.field]}</td>
                <td>
                  <input type="text" value={c.header} onChange={(e) => update(i, { header: e.target.value })} aria-label={`Header for ${FIELD_NAMES[c.field]}`} aria-invalid={c.included && c.header.trim() === ''} />
                </td>
                <td className="wb-export-order">
                  <Button tone="quiet" onClick={() => setColumns((cs) => move(cs, i, -1))} disabled={i === 0} aria-label={`Move ${FIELD_NAMES[c.field]} up`}>↑</Button>
                  <Button tone="quiet" onClick={() => setColumns((cs) => move(cs, i, 1))} disabled={i === columns.length - 1} aria-label={`Move ${FIELD_NAMES[c.field]} down`}>↓</Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {emptyHeader && <p className="wb-field-error">Every included column needs a header.</p>}
        {chosen.length === 0 && <p className="wb-field-error">Choose at least one column.</p>}
      </fieldset>

      <fieldset className="wb-export-group">
        <legend>Also include</legend>
        <p className="wb-hint">{format === 'xlsx' ? 'Each as an extra sheet in the workbook.' : 'Each as its own .csv file next to the main one.'}</p>
        {extras.map((x) => (
          <label key={x.key} className="wb-inline">
            <input type="checkbox" checked={include[x.key]} onChange={(e) => setInclude((v) => ({ ...v, [x.key]: e.target.checked }))} />
            {x.label}
          </label>
        ))}
      </fieldset>

      <div className="wb-export-preview">
        <table className="wb-data-table" aria-describedby={ids.preview}>
          <caption>Preview: the first {preview.length} of {project.gradebook.students.length} rows</caption>
          <thead><tr>{chosen.map((c, i) => <th key={i} scope="col">{c.header}</th>)}</tr></thead>
          <tbody>{preview.map((row, r) => <tr key={r}>{row.map((v, i) => <td key={i}>{v === null ? '' : String(v)}</td>)}</tr>)}</tbody>
        </table>
        <p id={ids.preview} className="wb-hint">Blank cells: no value (no mark yet, no e-mail). Numbers are written as numbers.</p>
      </div>

      <div className="wb-export-path">
        <label htmlFor={ids.path}>Save to</label>
        <div className="wb-export-path-row">
          <input id={ids.path} type="text" value={path} onChange={(e) => { setPath(e.target.value); setStatus({ kind: 'idle' }); }} placeholder={`/path/to/${suggestedExportName(project.title, format)}`} spellCheck={false} />
          {bridge.hasNativeDialogs && <Button onClick={() => void choose()}>Choose…</Button>}
        </div>
      </div>

      <div role="status" aria-live="polite" className="wb-export-status">
        {status.kind === 'writing' && <p>Writing…</p>}
        {status.kind === 'done' && <p className="wb-export-done">Wrote {status.rows} students to {status.path}.</p>}
        {status.kind === 'failed' && <p className="wb-field-error">{status.message}</p>}
      </div>
      {status.kind === 'confirmOverwrite' && (
        <div className="wb-export-confirm" role="alertdialog" aria-label="Replace the existing file?">
          <p>{status.message}</p>
          <p>Replace it with this export?</p>
          <Button tone="danger" onClick={() => void write(true)}>Replace the file</Button>{' '}
          <Button onClick={() => setStatus({ kind: 'idle' })}>Keep it</Button>
        </div>
      )}

      <div className="wb-modal-actions">
        <Button onClick={onClose}>{status.kind === 'done' ? 'Close' : 'Cancel'}</Button>
        <Button tone="primary" onClick={() => void write(false)} disabled={!canWrite || status.kind === 'confirmOverwrite'}>Export</Button>
      </div>
    </Modal>
  );
}
