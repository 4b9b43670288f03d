/**
 * The one contract between the renderer and the main process. Every call the UI may make to the
 * machine is a method of `DesktopBridge`; three things implement it — the Electron preload (over
 * ipcRenderer.invoke), the browser harness (over a loopback connection) and tests — and all of
 * them end in the same `main/services` functions.
 *
 * Everything here is plain data (structured-clone safe). Types only: no runtime code, so both
 * sides may import it. Failures are returned, not thrown, because a thrown Error loses everything
 * but its message across IPC.
 */
import type { ScoreTokens } from '../engine/grading/parseScore';
import type { Gradebook, GradingPlan } from '../engine/model';

/** Where in a spreadsheet a problem is, in the words the user sees in their spreadsheet program. */
export interface CellLocation {
  readonly sheet: string;
  /** 1-based row number as shown in the spreadsheet. */
  readonly row?: number;
  /** Column letter(s) as shown in the spreadsheet ("A", "AB"). */
  readonly column?: string;
  /** Header text of that column, when known. */
  readonly header?: string;
  /** The offending cell text, verbatim. */
  readonly value?: string;
}

export interface ImportProblem {
  readonly severity: 'error' | 'warning';
  /** Stable machine code, e.g. 'duplicate-id', 'above-possible', 'unreadable-score'. */
  readonly code: string;
  /** One sentence naming the place and the fix. */
  readonly message: string;
  readonly at?: CellLocation;
}

/** Score tokens are an engine rule (renderer/engine/grading/parseScore.ts); re-exported here. */
export type { ScoreTokens };

export type ColumnRole =
  | 'id'
  | 'name'
  | 'firstName'
  | 'lastName'
  | 'section'
  | 'email'
  | 'assessment'
  | 'ignore';

export interface ColumnLayout {
  /** 0-based column index in the sheet. */
  readonly index: number;
  readonly header: string;
  readonly role: ColumnRole;
  /** Points possible for an assessment column, when known from the file or typed by the user. */
  readonly possible?: number;
}

export type TextEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface SheetLayout {
  readonly sheet: string;
  /** 0-based row index of the header row (title rows above it are skipped). */
  readonly headerRow: number;
  /** 0-based row index of a "points possible" row, or null. */
  readonly possibleRow: number | null;
  readonly columns: readonly ColumnLayout[];
}

export interface ImportLayout {
  /** Sheets to import, each with its own layout. */
  readonly sheets: readonly SheetLayout[];
  /** Section from a column, or from the sheet name (one sheet per section). */
  readonly sectionFrom: 'column' | 'sheetName';
  readonly tokens: ScoreTokens;
  /** Text files only: the encoding used (detected unless overridden). */
  readonly encoding?: TextEncoding;
  /** Text files only: the field delimiter. */
  readonly delimiter?: string;
}

export interface SheetPreview {
  readonly name: string;
  /** The first rows of the sheet as raw cell text (at most `previewRows`). */
  readonly rows: readonly (readonly string[])[];
  readonly totalRows: number;
  readonly totalColumns: number;
}

export interface WorkbookPreview {
  readonly path: string;
  readonly fileName: string;
  readonly format: 'xlsx' | 'xls' | 'ods' | 'csv' | 'tsv';
  /** SHA-256 of the file's bytes, to tell a re-import of the same file from a newer export. */
  readonly sha256: string;
  readonly encoding?: TextEncoding;
  readonly delimiter?: string;
  readonly sheets: readonly SheetPreview[];
  /** The layout the detector proposes; the user may correct it before importing. */
  readonly detected: ImportLayout;
  readonly problems: readonly ImportProblem[];
}

export interface SourceInfo {
  readonly path: string;
  readonly fileName: string;
  readonly sha256: string;
  readonly importedAt: string;
  readonly layout: ImportLayout;
}

/** The course as saved in a project file (schema-versioned by the project store). */
export interface CourseProject {
  readonly title: string;
  readonly gradebook: Gradebook;
  readonly plan: GradingPlan;
  readonly source: SourceInfo | null;
  readonly notes: string;
}

/** What a re-import of a newer export would change, shown before merging. */
export interface MergePreview {
  readonly addedStudents: readonly { readonly id: string; readonly name: string; readonly section: string }[];
  /** In the project but not in the new file: reported, kept, never deleted silently. */
  readonly missingStudents: readonly { readonly id: string; readonly name: string; readonly section: string }[];
  readonly addedAssessments: readonly string[];
  readonly changedScores: readonly {
    readonly studentId: string;
    readonly assessmentId: string;
    readonly before: string;
    readonly after: string;
  }[];
  /** The merged course if the user accepts. The plan is kept as it was. */
  readonly merged: CourseProject;
}

export type ExportFormat = 'xlsx' | 'csv';

/** A column of the final-marks export: which field, under which header. */
export interface ExportColumn {
  readonly field: 'id' | 'name' | 'section' | 'email' | 'final' | 'letter' | 'gradePoints';
  readonly header: string;
}

export interface ExportRequest {
  readonly path: string;
  readonly format: ExportFormat;
  readonly project: CourseProject;
  readonly columns: readonly ExportColumn[];
  /** Extra sheets (xlsx) or sibling files (csv). */
  readonly include: {
    readonly breakdown: boolean;
    readonly sectionStatistics: boolean;
    readonly assessmentStatistics: boolean;
  };
  /** The user has confirmed overwriting an existing file. */
  readonly overwrite: boolean;
  /** Path of the open project file, which the export must never replace; null/absent when unsaved. */
  readonly projectPath?: string | null;
}

export type Failure = {
  readonly ok: false;
  /** Stable code: 'not-found', 'bad-input', 'exists', 'damaged', 'newer-schema', 'io', 'cancelled' … */
  readonly code: string;
  readonly message: string;
  readonly problems?: readonly ImportProblem[];
};

export type Result<T> = { readonly ok: true; readonly value: T } | Failure;

export interface RecoveryInfo {
  readonly savedAt: string;
  /** The project file it belongs to, or null for a course never saved. */
  readonly projectPath: string | null;
  readonly project: CourseProject;
}

export type FileKind = 'spreadsheet' | 'project' | 'export' | 'report';

/**
 * Limits the user sets for one import, in the units the window shows. A limit left out takes the
 * default (DEFAULT_IMPORT_LIMITS_REQUEST in importLimits.ts). The size limit applies to every
 * reading; the time limit to reading in a worker (the desktop app).
 */
export interface ImportLimitsRequest {
  /** Largest file accepted, in binary megabytes (1 MB = 1024 × 1024 bytes). */
  readonly maxMegabytes?: number;
  /** Longest a reading may run, in seconds. */
  readonly maxSeconds?: number;
}

/** Every call the renderer may make to the main process. */
export interface DesktopBridge {
  /** Native dialogs exist (Electron); false in the browser harness, where the UI asks for a path. */
  readonly hasNativeDialogs: boolean;
  chooseOpenPath(kind: FileKind): Promise<Result<string | null>>;
  chooseSavePath(kind: FileKind, suggestedName: string): Promise<Result<string | null>>;
  previewSpreadsheet(path: string, override?: { encoding?: TextEncoding; delimiter?: string; limits?: ImportLimitsRequest }): Promise<Result<WorkbookPreview>>;
  importSpreadsheet(path: string, layout: ImportLayout, limits?: ImportLimitsRequest): Promise<Result<{ gradebook: Gradebook; problems: readonly ImportProblem[] }>>;
  previewMerge(current: CourseProject, path: string, layout: ImportLayout, limits?: ImportLimitsRequest): Promise<Result<MergePreview>>;
  loadProject(path: string): Promise<Result<CourseProject>>;
  saveProject(path: string, project: CourseProject): Promise<Result<{ path: string; savedAt: string }>>;
  exportFinals(request: ExportRequest): Promise<Result<{ path: string; rows: number }>>;
  /**
   * The recovery copy of unsaved work. `projectJson` is JSON.stringify of the CourseProject: the
   * renderer serialises it in slices (a course of 10 000 students is tens of megabytes of JSON,
   * too long to build in one task), and the main process parses and validates it.
   */
  writeRecovery(projectPath: string | null, projectJson: string): Promise<Result<{ savedAt: string }>>;
  readRecovery(): Promise<Result<RecoveryInfo | null>>;
  discardRecovery(): Promise<Result<null>>;
  recentFiles(): Promise<Result<readonly string[]>>;
  /** The invented demo course, as a project, for first start. */
  demoCourse(): Promise<Result<CourseProject>>;
}

/** What a menu item asks the renderer to do. The renderer owns the state, so it does the work. */
export type MenuCommand =
  | 'open-project'
  | 'import-spreadsheet'
  | 'save'
  | 'save-as'
  | 'export'
  | 'undo'
  | 'redo'
  | { readonly kind: 'open-recent'; readonly path: string };

/**
 * What the Electron preload exposes beside the DesktopBridge methods. The browser harness provides
 * none of them, so the renderer sees them as optional (`Partial<ShellExtras>`).
 */
export interface ShellExtras {
  /** Subscribe to menu commands; returns the unsubscribe function. */
  onMenuCommand(listener: (command: MenuCommand) => void): () => void;
  /** The file-system path of a dropped file (Electron's webUtils.getPathForFile); '' when it has none. */
  pathForFile(file: File): string;
  /** Tell the main process whether there are unsaved changes (asked about on close). */
  setDirty(dirty: boolean): Promise<void>;
  /** Print a self-contained HTML page (the summary report) to a PDF file with Electron's printToPDF. */
  printReportToPdf(html: string, path: string): Promise<Result<{ path: string }>>;
}
