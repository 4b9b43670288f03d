/**
 * Import: read a spreadsheet's preview, let the user correct the detected layout (rows, column
 * roles, points possible, tokens, sheets, text encoding), show the located problems of exactly
 * that layout (a dry-run import after each change), then load it as a new course or merge it
 * into the open one as a newer export. Nothing changes the course until the user confirms, and
 * the change is one undo step.
 */
import { useCallback, useEffect, useId, useRef, useState } from 'react';
import { useBridge } from '../../bridge/BridgeContext';
import { DEFAULT_IMPORT_LIMITS_REQUEST } from '../../bridge/importLimits';
import type {
  CourseProject,
  Failure,
  ImportLayout,
  ImportProblem,
  MergePreview,
  Result,
  ScoreTokens,
  TextEncoding,
  WorkbookPreview,
} from '../../bridge/contract';
import type { Gradebook } from '../../engine/model';
import { suggestPlan } from '../../engine/grading/suggestPlan';
import { useCourseStore } from '../../state/courseStore';
import { useFrame } from '../app/frameContext';
import { workspaces } from '../app/workspaces';
import { Button } from '../common/Button';
import { ImportLimitsFields, LIMIT_FAILURE_CODES, type ImportLimitValues } from './ImportLimitsFields';
import { MergeReview } from './MergeReview';
import { PreviewGrid } from './PreviewGrid';
import { ProblemList } from './ProblemList';
import {
  assessmentColumns,
  formatTokenList,
  readTokenList,
  setColumnPossible,
  setColumnRole,
  setHeaderRow,
  setPossibleRow,
  setSheetIncluded,
  setTokens,
  titleFor,
} from './layoutEdits';
import './import.css';

type ImportOutcome = Result<{ gradebook: Gradebook; problems: readonly ImportProblem[] }>;

interface Check {
  readonly layout: ImportLayout;
  readonly outcome: ImportOutcome;
}

interface Busy {
  readonly label: string;
}

/** Quiet period after a layout change before the dry run (typing a token list should not re-read per key). */
const CHECK_DELAY_MS = 250;

const encodings: readonly { value: TextEncoding; label: string }[] = [
  { value: 'utf-8', label: 'UTF-8' },
  { value: 'windows-1252', label: 'Windows-1252 (Western)' },
  { value: 'utf-16le', label: 'UTF-16 LE' },
  { value: 'utf-16be', label: 'UTF-16 BE' },
];

const delimiters: readonly { value: string; label: string }[] = [
  { value: ',', label: 'Comma' },
  { value: ';', label: 'Semicolon' },
  { value: '\t', label: 'Tab' },
  { value: '|', label: 'Vertical bar' },
];

function problemsOf(outcome: ImportOutcome): readonly ImportProblem[] {
  if (outcome.ok) return outcome.value.problems;
  return outcome.problems ?? [{ severity: 'error', code: outcome.code, message: outcome.message }];
}

function failureText(f: Failure): string {
  const first = f.problems?.find((p) => p.severity === 'error');
  return first !== undefined && first.message !== f.message ? `${f.message} ${first.message}` : f.message;
}

export function ImportWorkspace() {
  const bridge = useBridge();
  const store = useCourseStore();
  const frame = useFrame();
  const [path, setPath] = useState<string | null>(null);
  const [preview, setPreview] = useState<WorkbookPreview | null>(null);
  const [layout, setLayout] = useState<ImportLayout | null>(null);
  const [activeSheet, setActiveSheet] = useState<string | null>(null);
  const [check, setCheck] = useState<Check | null>(null);
  const [busy, setBusy] = useState<Busy | null>(null);
  const [readError, setReadError] = useState<Failure | null>(null);
  const [merge, setMerge] = useState<MergePreview | null>(null);
  const [limits, setLimits] = useState<ImportLimitValues>(DEFAULT_IMPORT_LIMITS_REQUEST);
  /** The last read's override (encoding, delimiter), so "Read again" repeats it under the new limits. */
  const lastOverride = useRef<{ encoding?: TextEncoding; delimiter?: string } | undefined>(undefined);
  /** Bumped by every long call and by Cancel: a reply whose serial is stale is discarded. */
  const serial = useRef(0);
  const checkSerial = useRef(0);
  const handledRequest = useRef(0);

  const runBusy = useCallback(async <T,>(label: string, call: () => Promise<T>): Promise<T | null> => {
    const mine = ++serial.current;
    setBusy({ label });
    try {
      const value = await call();
      return serial.current === mine ? value : null;
    } finally {
      if (serial.current === mine) setBusy(null);
    }
  }, []);

  const cancel = () => {
    serial.current += 1;
    setBusy(null);
  };

  const readPreview = useCallback(
    async (file: string, override?: { encoding?: TextEncoding; delimiter?: string }) => {
      lastOverride.current = override;
      const r = await runBusy(`Reading ${file}`, () => bridge.previewSpreadsheet(file, { ...override, limits }));
      if (r === null) return;
      setPath(file);
      setMerge(null);
      if (!r.ok) {
        setReadError(r);
        setPreview(null);
        setLayout(null);
        setCheck(null);
        return;
      }
      setReadError(null);
      setPreview(r.value);
      setLayout(r.value.detected);
      setCheck(null);
      setActiveSheet(r.value.detected.sheets[0]?.sheet ?? r.value.sheets[0]?.name ?? null);
    },
    [bridge, runBusy, limits],
  );

  // A file handed over by the frame (menu, drop, path dialog).
  useEffect(() => {
    const request = frame.importRequest;
    if (request === null || request.serial === handledRequest.current) return;
    handledRequest.current = request.serial;
    frame.clearImportRequest();
    void readPreview(request.path);
  }, [frame, readPreview]);

  // Dry run on every layout change: the problem list is always that of the layout shown.
  useEffect(() => {
    if (path === null || layout === null) return;
    const mine = ++checkSerial.current;
    const timer = setTimeout(() => {
      void bridge.importSpreadsheet(path, layout, limits).then((outcome) => {
        if (checkSerial.current === mine) setCheck({ layout, outcome });
      });
    }, CHECK_DELAY_MS);
    return () => clearTimeout(timer);
  }, [bridge, path, layout, limits]);

  const chooseFile = async () => {
    const chosen = await frame.choosePath({ kind: 'spreadsheet', mode: 'open', title: 'Import a spreadsheet' });
    if (chosen !== null) await readPreview(chosen);
  };

  const current = check !== null && check.layout === layout ? check : null;
  const problems = current !== null ? problemsOf(current.outcome) : (preview?.problems ?? []);
  const hasErrors = problems.some((p) => p.severity === 'error');
  const canLoad = current !== null && current.outcome.ok && !hasErrors && busy === null;

  const loadNew = async () => {
    if (path === null || preview === null || layout === null) return;
    const r = await runBusy(`Importing ${preview.fileName}`, () => bridge.importSpreadsheet(path, layout, limits));
    if (r === null) return;
    if (!r.ok) {
      frame.notify(failureText(r), 'error');
      return;
    }
    const gradebook = r.value.gradebook;
    const project: CourseProject = {
      title: titleFor(preview, layout),
      gradebook,
      plan: suggestPlan(gradebook),
      source: { path, fileName: preview.fileName, sha256: preview.sha256, importedAt: new Date().toISOString(), layout },
      notes: '',
    };
    store.apply({ kind: 'replaceProject', label: `Import ${preview.fileName}`, project });
    frame.notify(`Loaded ${gradebook.students.length} students and ${gradebook.assessments.length} assessments from ${preview.fileName}. The grading plan is a suggestion: check it in Plan.`, 'success');
    resetAfterLoad();
  };

  const startMerge = async () => {
    if (path === null || layout === null || store.project === null) return;
    const project = store.project;
    const r = await runBusy('Comparing with the open course', () => bridge.previewMerge(project, path, layout, limits));
    if (r === null) return;
    if (!r.ok) {
      frame.notify(failureText(r), 'error');
      return;
    }
    setMerge(r.value);
  };

  const acceptMerge = () => {
    if (merge === null || preview === null) return;
    store.apply({ kind: 'replaceProject', label: `Merge ${preview.fileName}`, project: merge.merged });
    frame.notify(`Merged ${preview.fileName}: ${merge.changedScores.length} changed scores, ${merge.addedStudents.length} students added.`, 'success');
    resetAfterLoad();
  };

  const resetAfterLoad = () => {
    setMerge(null);
    setPreview(null);
    setLayout(null);
    setCheck(null);
    setPath(null);
    const roster = workspaces.find((w) => w.id === 'roster');
    if (roster !== undefined) frame.showWorkspace(roster.id);
  };

  const edit = (f: (l: ImportLayout) => ImportLayout) => setLayout((l) => (l === null ? l : f(l)));

  return (
    <section className="wb-import" aria-labelledby="wb-import-title">
      <div className="wb-import-head">
        <h2 id="wb-import-title">Import a spreadsheet</h2>
        <Button tone={preview === null ? 'primary' : 'plain'} onClick={() => void chooseFile()} disabled={busy !== null}>
          {preview === null ? 'Choose a spreadsheet…' : 'Choose another file…'}
        </Button>
        {path !== null && <span className="wb-import-path wb-mono">{path}</span>}
      </div>

      {busy !== null && (
        <div className="wb-import-busy" role="status">
          <progress aria-label={busy.label} />
          <span>{busy.label}…</span>
          <Button onClick={cancel}>Cancel</Button>
        </div>
      )}

      {preview === null && readError === null && busy === null && (
        <p className="wb-hint wb-import-intro">
          Exports from a course site or a spreadsheet of your own: one row per student, one column per assessment
          (.xlsx, .xls, .ods, .csv, .tsv). The file is only read, never changed.
        </p>
      )}

      <ImportLimitsFields limits={limits} onChange={setLimits} />

      {readError !== null && (
        <div className="wb-import-error" role="alert">
          <p>{readError.message}</p>
          {path !== null && LIMIT_FAILURE_CODES.includes(readError.code) && (
            <Button onClick={() => void readPreview(path, lastOverride.current)} disabled={busy !== null}>Read again with these limits</Button>
          )}
          {readError.problems !== undefined && <ProblemList problems={readError.problems} checking={false} />}
        </div>
      )}

      {preview !== null && layout !== null && (
        <>
          <LayoutControls
            preview={preview}
            layout={layout}
            activeSheet={activeSheet}
            onActiveSheet={setActiveSheet}
            onEdit={edit}
            onReread={(override) => path !== null && void readPreview(path, override)}
          />
          {preview.sheets.filter((s) => s.name === activeSheet).map((s) => (
            <PreviewGrid
              key={s.name}
              preview={s}
              layout={layout.sheets.find((l) => l.sheet === s.name) ?? null}
              onRole={(index, role) => edit((l) => setColumnRole(l, s.name, index, role))}
              onPossible={(index, possible) => edit((l) => setColumnPossible(l, s.name, index, possible))}
            />
          ))}
          <div className="wb-import-lower">
            <AssessmentList layout={layout} />
            <ProblemList problems={problems} checking={current === null} />
          </div>
          <div className="wb-import-actions">
            <Button tone="primary" onClick={() => void loadNew()} disabled={!canLoad}>Load into course</Button>
            {store.project !== null && (
              <Button onClick={() => void startMerge()} disabled={!canLoad}>Merge as newer export</Button>
            )}
            <span className="wb-hint" aria-live="polite">
              {current === null ? 'Checking the layout…' : hasErrors ? 'Correct the errors above to load.' : 'Ready to load.'}
              {store.project !== null && !hasErrors && current !== null && ` Load replaces “${store.project.title}” (undo brings it back); merge updates it.`}
            </span>
          </div>
        </>
      )}

      {merge !== null && preview !== null && (
        <MergeReview merge={merge} fileName={preview.fileName} onAccept={acceptMerge} onCancel={() => setMerge(null)} />
      )}
    </section>
  );
}

function AssessmentList({ layout }: { layout: ImportLayout }) {
  const items = assessmentColumns(layout);
  return (
    <section className="wb-import-assessments" aria-labelledby="wb-assessments-title">
      <h3 id="wb-assessments-title">Assessments to import ({items.length})</h3>
      <ul aria-labelledby="wb-assessments-title">
        {items.map(({ column }) => (
          <li key={column.header}>
            {column.header}
            <span className="wb-hint">{column.possible !== undefined ? ` · ${column.possible} pts` : ' · points from the file'}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

function LayoutControls({ preview, layout, activeSheet, onActiveSheet, onEdit, onReread }: {
  preview: WorkbookPreview;
  layout: ImportLayout;
  activeSheet: string | null;
  onActiveSheet(name: string): void;
  onEdit(f: (l: ImportLayout) => ImportLayout): void;
  onReread(override: { encoding?: TextEncoding; delimiter?: string }): void;
}) {
  const id = useId();
  const sheetPreview = preview.sheets.find((s) => s.name === activeSheet);
  const sheetLayout = layout.sheets.find((s) => s.sheet === activeSheet);
  const order = preview.sheets.map((s) => s.name);
  const isText = preview.format === 'csv' || preview.format === 'tsv';
  const rowOptions = sheetPreview?.rows.map((_, r) => r) ?? [];

  return (
    <div className="wb-import-controls">
      {preview.sheets.length > 1 && (
        <fieldset className="wb-import-sheets">
          <legend>Sheets to import</legend>
          {preview.sheets.map((s) => {
            const included = layout.sheets.some((l) => l.sheet === s.name);
            return (
              <span key={s.name} className={`wb-sheet-chip ${s.name === activeSheet ? 'wb-sheet-chip-active' : ''}`}>
                <input
                  type="checkbox"
                  id={`${id}-sheet-${order.indexOf(s.name)}`}
                  checked={included}
                  onChange={(e) => onEdit((l) => setSheetIncluded(l, s, e.target.checked, order))}
                />
                <label htmlFor={`${id}-sheet-${order.indexOf(s.name)}`}>{s.name}</label>
                <Button tone="quiet" onClick={() => onActiveSheet(s.name)} aria-pressed={s.name === activeSheet} aria-label={`Show sheet ${s.name}`}>
                  show
                </Button>
              </span>
            );
          })}
        </fieldset>
      )}

      <fieldset className="wb-import-rows">
        <legend>Rows{preview.sheets.length > 1 && activeSheet !== null ? ` of ${activeSheet}` : ''}</legend>
        {sheetLayout !== undefined && sheetPreview !== undefined ? (
          <>
            <label htmlFor={`${id}-header`}>Header row</label>
            <select id={`${id}-header`} value={sheetLayout.headerRow} onChange={(e) => onEdit((l) => setHeaderRow(l, sheetPreview, Number(e.target.value)))}>
              {rowOptions.map((r) => <option key={r} value={r}>{r + 1}</option>)}
            </select>
            <label htmlFor={`${id}-possible`}>Points-possible row</label>
            <select
              id={`${id}-possible`}
              value={sheetLayout.possibleRow ?? ''}
              onChange={(e) => onEdit((l) => setPossibleRow(l, sheetLayout.sheet, e.target.value === '' ? null : Number(e.target.value)))}
            >
              <option value="">None</option>
              {rowOptions.filter((r) => r > sheetLayout.headerRow).map((r) => <option key={r} value={r}>{r + 1}</option>)}
            </select>
          </>
        ) : (
          <span className="wb-hint">This sheet is not imported.</span>
        )}
      </fieldset>

      <fieldset className="wb-import-sections">
        <legend>Section from</legend>
        <span>
          <input type="radio" id={`${id}-sec-col`} name={`${id}-sec`} checked={layout.sectionFrom === 'column'} onChange={() => onEdit((l) => ({ ...l, sectionFrom: 'column' }))} />
          <label htmlFor={`${id}-sec-col`}>a column</label>
        </span>
        <span>
          <input type="radio" id={`${id}-sec-sheet`} name={`${id}-sec`} checked={layout.sectionFrom === 'sheetName'} onChange={() => onEdit((l) => ({ ...l, sectionFrom: 'sheetName' }))} />
          <label htmlFor={`${id}-sec-sheet`}>the sheet name</label>
        </span>
      </fieldset>

      <fieldset className="wb-import-tokens">
        <legend>Cell text that means</legend>
        {(['excused', 'missing', 'pending'] as const satisfies readonly (keyof ScoreTokens)[]).map((kind) => (
          <TokenField key={kind} kind={kind} tokens={layout.tokens[kind]} onCommit={(list) => onEdit((l) => setTokens(l, kind, list))} />
        ))}
        <span className="wb-hint">Comma-separated, any case; (blank) is an empty cell.</span>
      </fieldset>

      {isText && (
        <fieldset className="wb-import-text">
          <legend>Text file</legend>
          <label htmlFor={`${id}-enc`}>Encoding</label>
          <select id={`${id}-enc`} value={preview.encoding ?? 'utf-8'} onChange={(e) => onReread({ encoding: e.target.value as TextEncoding, ...(preview.delimiter !== undefined ? { delimiter: preview.delimiter } : {}) })}>
            {encodings.map((e) => <option key={e.value} value={e.value}>{e.label}</option>)}
          </select>
          <label htmlFor={`${id}-delim`}>Delimiter</label>
          <select id={`${id}-delim`} value={preview.delimiter ?? ','} onChange={(e) => onReread({ delimiter: e.target.value, ...(preview.encoding !== undefined ? { encoding: preview.encoding } : {}) })}>
            {delimiters.map((d) => <option key={d.value} value={d.value}>{d.label}</option>)}
          </select>
        </fieldset>
      )}
    </div>
  );
}

function TokenField({ kind, tokens, onCommit }: { kind: keyof ScoreTokens; tokens: readonly string[]; onCommit(list: string[]): void }) {
  const id = useId();
  const [text, setText] = useState(formatTokenList(tokens));
  useEffect(() => setText(formatTokenList(tokens)), [tokens]);
  const commit = () => {
    const list = readTokenList(text);
    if (formatTokenList(list) !== formatTokenList(tokens)) onCommit(list);
  };
  const labels: Record<keyof ScoreTokens, string> = { excused: 'Excused', missing: 'Missing', pending: 'Pending' };
  return (
    <span className="wb-token-field">
      <label htmlFor={id}>{labels[kind]}</label>
      <input id={id} type="text" value={text} onChange={(e) => setText(e.target.value)} onBlur={commit} onKeyDown={(e) => e.key === 'Enter' && commit()} />
    </span>
  );
}
