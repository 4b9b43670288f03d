/**
 * The window's frame: top bar (course, save state, file and history commands), the workspace
 * rail, the active workspace, the standing caution, notices and dialogs. It also owns the
 * commands every entry point shares (keyboard, native menu, buttons, file drop), so each does the
 * same thing in the same words.
 */
import { useCallback, useEffect, useMemo, useRef, useState, type DragEvent, type KeyboardEvent as ReactKeyboardEvent } from 'react';
import { useBridge } from '../../bridge/BridgeContext';
import type { MenuCommand } from '../../bridge/extras';
import { fileKindOfPath, PROJECT_FILE_EXTENSION } from '../../bridge/fileKinds';
import { useCourseStore } from '../../state/courseStore';
import { Button } from '../common/Button';
import { ExportDialog } from '../export/ExportDialog';
import { Modal } from '../common/Modal';
import { FrameContext, type FrameApi, type ImportRequest, type NoticeTone, type PathRequest } from './frameContext';
import { Notices, type Notice } from './Notices';
import { PathDialog } from './PathDialog';
import { CAUTION_TEXT } from './caution';
import { formatTime } from './formatTime';
import { defaultWorkspace, workspaces, type WorkspaceId } from './workspaces';
import './frame.css';

const NOTICE_MS = 6000;

interface PendingPath {
  readonly request: PathRequest;
  readonly initialPath: string;
  readonly resolve: (path: string | null) => void;
}

interface PendingConfirm {
  readonly title: string;
  readonly body: string;
  readonly confirmLabel: string;
  readonly resolve: (ok: boolean) => void;
}

function directoryOf(path: string): string {
  const i = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
  return i >= 0 ? path.slice(0, i + 1) : '';
}

function safeFileName(title: string): string {
  const cleaned = title.replace(/[\\/:*?"<>|]+/g, ' ').replace(/\s+/g, ' ').trim();
  return (cleaned === '' ? 'course' : cleaned) + PROJECT_FILE_EXTENSION;
}

/** Text fields keep their own Ctrl+Z; the course history takes it everywhere else. */
function isTextEditing(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  if (target instanceof HTMLTextAreaElement) return true;
  return target instanceof HTMLInputElement && !['checkbox', 'radio', 'button', 'submit', 'range'].includes(target.type);
}

export function Frame() {
  const bridge = useBridge();
  const store = useCourseStore();
  const [workspace, setWorkspace] = useState<WorkspaceId>(defaultWorkspace);
  const [notices, setNotices] = useState<readonly Notice[]>([]);
  const [pendingPath, setPendingPath] = useState<PendingPath | null>(null);
  const [pendingConfirm, setPendingConfirm] = useState<PendingConfirm | null>(null);
  const [importRequest, setImportRequest] = useState<ImportRequest | null>(null);
  const lastDir = useRef<string>('');
  const noticeSerial = useRef(0);
  const importSerial = useRef(0);

  const dismiss = useCallback((id: number) => setNotices((ns) => ns.filter((n) => n.id !== id)), []);
  const notify = useCallback(
    (message: string, tone: NoticeTone = 'info') => {
      const id = ++noticeSerial.current;
      setNotices((ns) => [...ns.slice(-3), { id, message, tone }]);
      // Errors stay until dismissed: the user may need to read the path or cell they name.
      if (tone !== 'error') setTimeout(() => dismiss(id), NOTICE_MS);
    },
    [dismiss],
  );

  const choosePath = useCallback(
    async (request: PathRequest): Promise<string | null> => {
      if (bridge.hasNativeDialogs) {
        const r = request.mode === 'open'
          ? await bridge.chooseOpenPath(request.kind)
          : await bridge.chooseSavePath(request.kind, request.suggestedName ?? '');
        if (!r.ok) {
          notify(r.message, 'error');
          return null;
        }
        if (r.value !== null) lastDir.current = directoryOf(r.value);
        return r.value;
      }
      const initialPath = request.mode === 'save' ? lastDir.current + (request.suggestedName ?? '') : lastDir.current;
      const path = await new Promise<string | null>((resolve) => setPendingPath({ request, initialPath, resolve }));
      setPendingPath(null);
      if (path !== null) lastDir.current = directoryOf(path);
      return path;
    },
    [bridge, notify],
  );

  const confirm = useCallback(
    (title: string, body: string, confirmLabel: string) =>
      new Promise<boolean>((resolve) => setPendingConfirm({ title, body, confirmLabel, resolve })).finally(() => setPendingConfirm(null)),
    [],
  );

  const saveTo = useCallback(
    async (path: string): Promise<boolean> => {
      if (store.project === null) return false;
      const r = await bridge.saveProject(path, store.project);
      if (!r.ok) {
        notify(r.message, 'error');
        return false;
      }
      store.markSaved(r.value.path);
      notify(`Saved to ${r.value.path}`, 'success');
      return true;
    },
    [bridge, notify, store],
  );

  const saveAs = useCallback(async (): Promise<boolean> => {
    if (store.project === null) return false;
    const path = await choosePath({ kind: 'project', mode: 'save', title: 'Save the course as', suggestedName: safeFileName(store.project.title) });
    return path === null ? false : saveTo(path);
  }, [choosePath, saveTo, store.project]);

  const save = useCallback(async (): Promise<boolean> => {
    if (store.projectPath === null) return saveAs();
    return saveTo(store.projectPath);
  }, [saveAs, saveTo, store.projectPath]);

  const openProject = useCallback(
    async (given?: string) => {
      if (store.dirty && !(await confirm('Open another course?', 'The open course has unsaved changes. They stay in the recovery copy only until the next change.', 'Open without saving'))) return;
      const path = given ?? (await choosePath({ kind: 'project', mode: 'open', title: 'Open a course project' }));
      if (path === null) return;
      const r = await bridge.loadProject(path);
      if (!r.ok) {
        notify(r.message, 'error');
        return;
      }
      store.open(r.value, path);
      notify(`Opened ${path}`, 'success');
    },
    [bridge, choosePath, confirm, notify, store],
  );

  const requestImport = useCallback((path: string) => {
    importSerial.current += 1;
    setImportRequest({ path, serial: importSerial.current });
    setWorkspace('import');
  }, []);

  /**
   * A path that came without a kind (recent file, command line, drop): projects open, anything
   * else goes to the Import workspace — an unknown extension too, since the importer decides the
   * type from the bytes and names the file when it cannot read it.
   */
  const openPath = useCallback(
    (path: string) => {
      if (fileKindOfPath(path) === 'project') void openProject(path);
      else requestImport(path);
    },
    [openProject, requestImport],
  );

  const chooseSpreadsheet = useCallback(async () => {
    const path = await choosePath({ kind: 'spreadsheet', mode: 'open', title: 'Import a spreadsheet' });
    if (path !== null) requestImport(path);
  }, [choosePath, requestImport]);

  const [exportOpen, setExportOpen] = useState(false);
  const openExport = useCallback(() => {
    if (store.project !== null) setExportOpen(true);
  }, [store.project]);

  const runCommand = useCallback(
    (command: MenuCommand) => {
      if (typeof command === 'object') {
        openPath(command.path);
        return;
      }
      switch (command) {
        case 'open-project': void openProject(); break;
        case 'import-spreadsheet': void chooseSpreadsheet(); break;
        case 'save': void save(); break;
        case 'save-as': void saveAs(); break;
        case 'export': openExport(); break;
        case 'undo': store.undo(); break;
        case 'redo': store.redo(); break;
      }
    },
    [chooseSpreadsheet, openExport, openPath, openProject, save, saveAs, store],
  );

  // Native menu (desktop app only).
  useEffect(() => bridge.onMenuCommand?.(runCommand), [bridge, runCommand]);

  const modalOpen = pendingPath !== null || pendingConfirm !== null || exportOpen;

  // Keyboard shortcuts, on the window so they work wherever focus is.
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (modalOpen || !(e.ctrlKey || e.metaKey) || e.altKey) return;
      const key = e.key.toLowerCase();
      if (key === 's') {
        e.preventDefault();
        void (e.shiftKey ? saveAs() : save());
      } else if (key === 'o') {
        e.preventDefault();
        void openProject();
      } else if (key === 'e') {
        e.preventDefault();
        openExport();
      } else if ((key === 'z' || key === 'y') && !isTextEditing(e.target)) {
        e.preventDefault();
        if (key === 'y' || e.shiftKey) store.redo();
        else store.undo();
      } else if (/^[1-9]$/.test(e.key) && !e.shiftKey) {
        const entry = workspaces[Number(e.key) - 1];
        if (entry !== undefined) {
          e.preventDefault();
          setWorkspace(entry.id);
        }
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [modalOpen, openExport, openProject, save, saveAs, store]);

  const onDrop = (e: DragEvent) => {
    const file = e.dataTransfer.files[0];
    if (file === undefined) return;
    e.preventDefault();
    const path = bridge.pathForFile?.(file) ?? '';
    if (path === '') {
      notify('A dropped file has no path in this window. Use Import and type the file path instead.', 'error');
      return;
    }
    openPath(path);
  };

  const frame = useMemo<FrameApi>(
    () => ({ workspace, showWorkspace: setWorkspace, notify, choosePath, importRequest, requestImport, clearImportRequest: () => setImportRequest(null), openProject, save, saveAs }),
    [workspace, notify, choosePath, importRequest, requestImport, openProject, save, saveAs],
  );

  const active = workspaces.find((w) => w.id === workspace) ?? workspaces[0];
  const ActiveComponent = active?.component;

  return (
    <FrameContext.Provider value={frame}>
      <div
        className="wb-frame"
        data-app-state={store.project === null ? 'starting' : 'ready'}
        onDragOver={(e) => {
          if (e.dataTransfer.types.includes('Files')) e.preventDefault();
        }}
        onDrop={onDrop}
      >
        <TopBar onOpen={() => void openProject()} onSave={() => void save()} onSaveAs={() => void saveAs()} onExport={openExport} />
        <WorkspaceRail current={workspace} onSelect={setWorkspace} />
        <main className="wb-workspace">
          <div id="wb-workspace-panel" role="tabpanel" aria-labelledby={`wb-tab-${workspace}`}>
            {store.project === null ? <p className="wb-starting">Opening the course…</p> : ActiveComponent !== undefined && <ActiveComponent />}
          </div>
        </main>
        <footer className="wb-frame-caution">
          <p role="note" aria-label="Caution">
            <span aria-hidden="true" className="wb-frame-caution-mark">!</span> {CAUTION_TEXT}
          </p>
        </footer>
        <Notices notices={notices} onDismiss={dismiss} />
      </div>
      {exportOpen && <ExportDialog onClose={() => setExportOpen(false)} />}
      {pendingPath !== null && (
        <PathDialog request={pendingPath.request} initialPath={pendingPath.initialPath} onDone={pendingPath.resolve} />
      )}
      {pendingConfirm !== null && (
        <Modal title={pendingConfirm.title} onCancel={() => pendingConfirm.resolve(false)}>
          <p>{pendingConfirm.body}</p>
          <div className="wb-modal-actions">
            <Button onClick={() => pendingConfirm.resolve(false)}>Cancel</Button>
            <Button tone="primary" onClick={() => pendingConfirm.resolve(true)}>{pendingConfirm.confirmLabel}</Button>
          </div>
        </Modal>
      )}
    </FrameContext.Provider>
  );
}

function SaveState() {
  const { dirty, projectPath, lastAutosave } = useCourseStore();
  let text: string;
  if (!dirty) text = projectPath === null ? 'Not saved to a file' : 'All changes saved';
  else text = projectPath === null ? 'Unsaved course' : 'Unsaved changes';
  return (
    <span className={`wb-save-state ${dirty ? 'wb-save-state-dirty' : ''}`} role="status" aria-live="polite">
      <span aria-hidden="true" className="wb-save-dot" />
      {text}
      {dirty && lastAutosave !== null && <span className="wb-save-recovery"> · recovery copy {formatTime(lastAutosave)}</span>}
    </span>
  );
}

function TopBar({ onOpen, onSave, onSaveAs, onExport }: { onOpen(): void; onSave(): void; onSaveAs(): void; onExport(): void }) {
  const store = useCourseStore();
  const title = store.project?.title ?? 'Weighbridge';
  const students = store.project?.gradebook.students.length;
  return (
    <header className="wb-topbar">
      <div className="wb-topbar-course">
        <span className="wb-appname">Weighbridge</span>
        <h1 className="wb-course-title">{title}</h1>
        {students !== undefined && (
          <span className="wb-course-meta">
            {students} {students === 1 ? 'student' : 'students'}
            {store.projectPath !== null && <> · <span className="wb-course-path">{store.projectPath}</span></>}
          </span>
        )}
        <SaveState />
      </div>
      <div className="wb-topbar-actions" role="toolbar" aria-label="Course commands">
        <Button onClick={onOpen} aria-keyshortcuts="Control+O">Open…</Button>
        <Button onClick={onSave} disabled={store.project === null} aria-keyshortcuts="Control+S">Save</Button>
        <Button onClick={onSaveAs} disabled={store.project === null} aria-keyshortcuts="Control+Shift+S">Save as…</Button>
        <Button onClick={onExport} disabled={store.project === null} aria-keyshortcuts="Control+E">Export final marks…</Button>
        <span className="wb-toolbar-gap" />
        <Button
          onClick={store.undo}
          disabled={!store.canUndo}
          aria-keyshortcuts="Control+Z"
          aria-label={store.undoLabel === null ? 'Undo' : `Undo ${store.undoLabel}`}
          title={store.undoLabel === null ? 'Nothing to undo' : `Undo ${store.undoLabel} (Ctrl+Z)`}
        >
          Undo
        </Button>
        <Button
          onClick={store.redo}
          disabled={!store.canRedo}
          aria-keyshortcuts="Control+Shift+Z Control+Y"
          aria-label={store.redoLabel === null ? 'Redo' : `Redo ${store.redoLabel}`}
          title={store.redoLabel === null ? 'Nothing to redo' : `Redo ${store.redoLabel} (Ctrl+Shift+Z)`}
        >
          Redo
        </Button>
      </div>
    </header>
  );
}

function WorkspaceRail({ current, onSelect }: { current: WorkspaceId; onSelect(id: WorkspaceId): void }) {
  const refs = useRef(new Map<WorkspaceId, HTMLButtonElement>());
  // Arrow keys move between tabs (WAI-ARIA tabs pattern, automatic activation).
  const onKeyDown = (e: ReactKeyboardEvent) => {
    const i = workspaces.findIndex((w) => w.id === current);
    let next: number | null = null;
    if (e.key === 'ArrowDown' || e.key === 'ArrowRight') next = (i + 1) % workspaces.length;
    if (e.key === 'ArrowUp' || e.key === 'ArrowLeft') next = (i - 1 + workspaces.length) % workspaces.length;
    if (e.key === 'Home') next = 0;
    if (e.key === 'End') next = workspaces.length - 1;
    const target = next === null ? undefined : workspaces[next];
    if (target === undefined) return;
    e.preventDefault();
    onSelect(target.id);
    refs.current.get(target.id)?.focus();
  };
  return (
    <nav className="wb-rail" aria-label="Workspaces">
      <div role="tablist" aria-orientation="vertical" aria-label="Workspaces" onKeyDown={onKeyDown}>
        {workspaces.map((w, i) => (
          <button
            key={w.id}
            ref={(el) => {
              if (el === null) refs.current.delete(w.id);
              else refs.current.set(w.id, el);
            }}
            type="button"
            role="tab"
            id={`wb-tab-${w.id}`}
            aria-selected={w.id === current}
            aria-controls="wb-workspace-panel"
            aria-keyshortcuts={`Control+${i + 1}`}
            tabIndex={w.id === current ? 0 : -1}
            className="wb-rail-tab"
            onClick={() => onSelect(w.id)}
          >
            <span className="wb-rail-key" aria-hidden="true">{i + 1}</span>
            {w.label}
          </button>
        ))}
      </div>
    </nav>
  );
}
