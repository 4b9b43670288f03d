/**
 * `weighbridge` — the batch command line over the same services and engine as the app, so a course
 * can be graded without the window and every rule is scriptable. Documented field by field in
 * docs/cli.md.
 *
 *   weighbridge grade <gradebook> --plan <plan-file> [--out finals.xlsx|.csv] [--extras] [--overwrite] [--json] [--quantile-type N]
 *   weighbridge stats <file> --column <name> [--by <column>] [--sheet <name>] [--quantile-type N] [--json]
 *   weighbridge check <gradebook> [--json]
 *   weighbridge init-plan <gradebook> [--out plan.json] [--overwrite]
 *
 * Exit codes: 0 ok, 1 bad input (a file that cannot be read, imported or written), 2 usage.
 * Results go to stdout, errors and warnings to stderr, progress to stderr only when it is a terminal.
 */
import { createHash } from 'node:crypto';
import { realpathSync } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import { basename, extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs, type ParseArgsConfig } from 'node:util';
import pkg from '../package.json' with { type: 'json' };
import type { CourseProject, ExportColumn, ImportLayout, ImportProblem } from '../renderer/bridge/contract';
import type { Defined } from '../renderer/engine/defined';
import type { Gradebook, GradingPlan, Score } from '../renderer/engine/model';
import type { StudentResult } from '../renderer/engine/results';
import { checkPlan, finishStudent, gradeCourse, layoutFor, suggestPlan, weighStudent, type CategoryLayout } from '../renderer/engine/grading';
import { createStreamGrader, effectiveWeightsOf, fillRow, sectionFinalStatistics, type StreamGrader } from '../renderer/engine/fast';
import { describe, QUANTILE_TYPES, type QuantileType, type Summary } from '../renderer/engine/stats';
import { leftOutTotal, outlierStudents, sectionStatistics } from '../renderer/engine/analysis';
import { exportCsvRows, exportFinals } from './services/export';
import { loadPlanFile, sameFile, savePlanFile, serialisePlan } from './services/project';
import { detectAndImport, readColumn, streamImportText } from './services/spreadsheet';

export const EXIT_OK = 0;
export const EXIT_BAD_INPUT = 1;
export const EXIT_USAGE = 2;

export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** Show progress lines (stderr is a terminal). */
  readonly progress: boolean;
  /** Resolves once stdout has taken what was written (backpressure for very long output); optional. */
  drain?(): Promise<void>;
}

class UsageError extends Error {}
class InputError extends Error {}

// ---------------------------------------------------------------------------------------------
// Help
// ---------------------------------------------------------------------------------------------

const HELP: Record<string, string> = {
  main: `weighbridge ${pkg.version} — final marks an instructor can defend

Usage: weighbridge <command> [options]

Commands:
  grade <gradebook> --plan <plan-file>   final marks per student and statistics per section
  stats <file> --column <name>           descriptive statistics of a numeric column
  check <gradebook>                      import diagnostics only
  init-plan <gradebook>                  write a starting plan file from the detected layout

Options: --help (also after a command), --version
Exit codes: 0 ok, 1 bad input, 2 usage. Details: docs/cli.md
Marks must be reviewed against your institution's grading policy before they are submitted.`,
  grade: `Usage: weighbridge grade <gradebook> --plan <plan-file> [options]

Grades every student of <gradebook> (.xlsx, .xls, .ods, .csv, .tsv) with the grading plan file.
  --plan <file>          plan file (format "weighbridge-plan"; see init-plan)
  --out <file>           also write the final marks to .xlsx or .csv
  --extras               with --out: add breakdown, section and assessment statistics
  --overwrite            with --out: replace an existing file
  --json                 print JSON instead of a table
  --quantile-type <1-9>  Hyndman & Fan (1996) quantile type for Q1/Q3 (default 7)`,
  stats: `Usage: weighbridge stats <file> --column <name> [options]

Descriptive statistics of one numeric column of any spreadsheet.
  --column <name>        header of the column (case and surrounding spaces ignored)
  --by <name>            also per group of this column (e.g. Section)
  --sheet <name>         the sheet to read (default: the first sheet with the column)
  --quantile-type <1-9>  Hyndman & Fan (1996) quantile type for Q1/Q3 (default 7)
  --json                 print JSON instead of text`,
  check: `Usage: weighbridge check <gradebook> [--json]

Reads and checks <gradebook> without grading: layout found, students, assessments, and every
problem with its sheet, row, column and value. Exit code 1 when the file cannot be imported.`,
  'init-plan': `Usage: weighbridge init-plan <gradebook> [--out plan.json] [--overwrite]

Writes a starting grading plan guessed from the assessment names (review it against the syllabus).
Without --out the plan file is printed to stdout.`,
};

// ---------------------------------------------------------------------------------------------
// Shared helpers
// ---------------------------------------------------------------------------------------------

function parse<T extends NonNullable<ParseArgsConfig['options']>>(args: readonly string[], options: T, command: string) {
  try {
    return parseArgs({ args: [...args], options: { ...options, help: { type: 'boolean' } }, allowPositionals: true, strict: true });
  } catch (error) {
    throw new UsageError(`${error instanceof Error ? error.message : String(error)}\nSee: weighbridge ${command} --help`);
  }
}

function onePositional(positionals: readonly string[], what: string, command: string): string {
  if (positionals.length !== 1 || positionals[0] === undefined) {
    throw new UsageError(`${command} needs exactly one ${what}${positionals.length > 1 ? ` (got ${positionals.length})` : ''}.\nSee: weighbridge ${command} --help`);
  }
  return positionals[0];
}

function quantileTypeOption(raw: string | undefined): QuantileType {
  if (raw === undefined) return 7;
  const n = Number(raw);
  const type = QUANTILE_TYPES.find((t) => t === n);
  if (type === undefined) throw new UsageError(`--quantile-type must be a whole number from 1 to 9 (Hyndman & Fan 1996 types); got "${raw}".`);
  return type;
}

const valueOf = <T>(d: Defined<T>): T | null => (d.defined ? d.value : null);

/** `{ field: reason }` for every statistic that is not defined. */
function notesOf(fields: Readonly<Record<string, Defined<unknown>>>): Record<string, string> {
  const notes: Record<string, string> = {};
  for (const [name, d] of Object.entries(fields)) if (!d.defined) notes[name] = d.reason;
  return notes;
}

function problemLines(problems: readonly ImportProblem[]): string[] {
  return problems.map((p) => `${p.severity}: ${p.message}`);
}

async function importGradebook(path: string, io: CliIo): Promise<{ gradebook: Gradebook; layout: ImportLayout; problems: readonly ImportProblem[] }> {
  if (io.progress) io.err(`Reading ${basename(path)}…`);
  const imported = await detectAndImport(path);
  if (!imported.ok) {
    const lines = imported.problems ? problemLines(imported.problems.filter((p) => p.severity === 'error')) : [];
    throw new InputError([imported.message, ...lines.slice(1)].join('\n'));
  }
  return imported.value;
}

function fmt(x: number | null, decimals = 2): string {
  if (x === null) return '—';
  return Number.isInteger(x) ? String(x) : x.toFixed(decimals).replace(/\.?0+$/, '');
}

/** Column widths by a loop: a spread of one argument per row overflows the call stack on large courses. */
function columnWidths(header: readonly string[], rowCount: number, rowAt: (i: number) => readonly string[]): number[] {
  const widths = header.map((h) => h.length);
  for (let i = 0; i < rowCount; i++) {
    const row = rowAt(i);
    for (let c = 0; c < widths.length; c++) {
      const n = (row[c] ?? '').length;
      if (n > widths[c]!) widths[c] = n;
    }
  }
  return widths;
}

const tableLine = (widths: readonly number[]) => (cells: readonly string[]) => cells.map((v, c) => v.padEnd(widths[c] ?? 0)).join('  ').trimEnd();

function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = columnWidths(header, rows.length, (i) => rows[i] ?? []);
  const line = tableLine(widths);
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

/** The same text as table(), written in blocks of lines so no string holds every row. */
async function writeTable(io: CliIo, header: readonly string[], rowCount: number, rowAt: (i: number) => readonly string[]): Promise<void> {
  const widths = columnWidths(header, rowCount, rowAt);
  const line = tableLine(widths);
  io.out([line(header), line(widths.map((w) => '-'.repeat(w)))].join('\n'));
  for (let i = 0; i < rowCount; i += OUTPUT_BLOCK) {
    const block: string[] = [];
    for (let j = i; j < Math.min(rowCount, i + OUTPUT_BLOCK); j++) block.push(line(rowAt(j)));
    io.out(block.join('\n'));
    await io.drain?.();
  }
}

/** Rows per write when output is produced incrementally. */
const OUTPUT_BLOCK = 2000;

// ---------------------------------------------------------------------------------------------
// grade
// ---------------------------------------------------------------------------------------------

/**
 * The section/course statistics object of `grade --json`, from the engine's `sectionStatistics`
 * on final marks (the Sections screen's numbers). On the final measure the only left-out reason is
 * "no final mark", so `withoutMark` is the left-out total; outliers are named by student ID.
 */
function sectionJson(idOf: (studentIndex: number) => string, section: string | null, summary: Summary, studentIndices: readonly number[], withoutMark: number) {
  const fields = {
    mean: summary.mean, median: summary.median, sd: summary.sampleSd, populationSd: summary.populationSd,
    min: summary.min, max: summary.max, q1: summary.q1, q3: summary.q3, iqr: summary.iqr,
    lowerFence: summary.lowerFence, upperFence: summary.upperFence,
  };
  return {
    section,
    n: summary.n,
    withoutMark,
    mean: valueOf(summary.mean),
    median: valueOf(summary.median),
    sd: valueOf(summary.sampleSd),
    populationSd: valueOf(summary.populationSd),
    min: valueOf(summary.min),
    max: valueOf(summary.max),
    q1: valueOf(summary.q1),
    q3: valueOf(summary.q3),
    iqr: valueOf(summary.iqr),
    lowerFence: valueOf(summary.lowerFence),
    upperFence: valueOf(summary.upperFence),
    outliers: outlierStudents(summary, studentIndices).map((o) => ({ id: idOf(o.studentIndex), value: o.value, side: o.side })),
    quantileType: summary.quantileType,
    quantileMethod: summary.quantileMethod,
    notes: notesOf(fields),
  };
}

function studentJson(book: Gradebook, result: StudentResult, index: number) {
  const student = book.students[index];
  const noMark = result.lines.find((l) => l.kind === 'noMark');
  const notes: Record<string, string> = {};
  if (result.final === null && noMark?.kind === 'noMark') notes['final'] = noMark.reason;
  else if (result.letter === null && noMark?.kind === 'noMark') notes['letter'] = noMark.reason;
  return {
    id: result.studentId,
    name: student?.name ?? '',
    section: result.section,
    final: result.final,
    letter: result.letter,
    gradePoints: result.gradePoints,
    weighted: result.weighted,
    effectiveWeights: result.effectiveWeights,
    notes,
  };
}

const EXPORT_COLUMNS: readonly ExportColumn[] = [
  { field: 'id', header: 'Student ID' },
  { field: 'name', header: 'Name' },
  { field: 'section', header: 'Section' },
  { field: 'final', header: 'Final %' },
  { field: 'letter', header: 'Letter' },
  { field: 'gradePoints', header: 'Grade points' },
];

async function grade(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args, {
    plan: { type: 'string' },
    out: { type: 'string' },
    extras: { type: 'boolean' },
    overwrite: { type: 'boolean' },
    json: { type: 'boolean' },
    'quantile-type': { type: 'string' },
  }, 'grade');
  if (values.help) return help('grade', io);
  const path = onePositional(positionals, 'gradebook file', 'grade');
  if (values.plan === undefined) throw new UsageError('grade needs --plan <plan-file> (write a first one with: weighbridge init-plan <gradebook> --out plan.json).');
  const quantileType = quantileTypeOption(values['quantile-type']);
  const out = values.out;
  if (out !== undefined && !['.xlsx', '.csv'].includes(extname(out).toLowerCase())) {
    throw new UsageError(`--out must name a .xlsx or .csv file; got "${out}".`);
  }
  if ((values.extras || values.overwrite) && out === undefined) throw new UsageError('--extras and --overwrite go with --out <file>.');

  const ext = extname(path).toLowerCase();
  if (ext === '.csv' || ext === '.tsv') {
    const size = await stat(path).then((st) => (st.isFile() ? st.size : -1), () => -1);
    if (size > streamThreshold()) {
      const whole = out !== undefined && (values.extras === true || extname(out).toLowerCase() === '.xlsx');
      if (whole && size > IN_MEMORY_LIMIT) {
        throw new InputError(
          `"${basename(path)}" is ${Math.round(size / 2 ** 20)} MiB; --out .xlsx and --extras hold the whole course in memory and are refused above ${IN_MEMORY_LIMIT / 2 ** 20} MiB. Use --out <name>.csv without --extras for a file this large.`,
        );
      }
      if (!whole) {
        const code = await gradeStreamed(path, values.plan, { out, overwrite: values.overwrite === true, json: values.json === true, quantileType }, io);
        if (code !== null) return code;
      }
    }
  }

  const imported = await importGradebook(path, io);
  const plan = await loadPlanFile(values.plan);
  if (!plan.ok) throw new InputError(plan.message);
  const book = imported.gradebook;
  if (io.progress) io.err(`Grading ${book.students.length} students…`);
  const { students, planProblems } = gradeCourse(book, plan.value);
  for (const p of problemLines(imported.problems)) io.err(p);
  for (const p of planProblems) io.err(`plan: ${p}`);

  if (out !== undefined) {
    const project = await projectFor(path, book, imported.layout, plan.value);
    const format = extname(out).toLowerCase() === '.xlsx' ? 'xlsx' : 'csv';
    const extras = values.extras === true;
    const written = await exportFinals({
      path: out,
      format,
      project,
      columns: EXPORT_COLUMNS,
      include: { breakdown: extras, sectionStatistics: extras, assessmentStatistics: extras },
      overwrite: values.overwrite === true,
      // The plan file is the nearest thing to a project file here: never let the export replace it.
      projectPath: values.plan,
    });
    if (!written.ok) throw new InputError(written.code === 'exists' ? `${written.message} (use --overwrite)` : written.message);
    io.err(`Wrote ${written.value.rows} final marks to ${written.value.path}. The file holds identifiable student data.`);
  }

  const stats = sectionStatistics(book, students, { measure: { kind: 'final' }, quantileType });
  const idOf = (i: number) => book.students[i]?.id ?? '';
  const sections = stats.sections.map((g) => sectionJson(idOf, g.section, g.summary, g.studentIndices, leftOutTotal(g.leftOut)));
  const course = sectionJson(idOf, null, stats.course, stats.courseStudentIndices, leftOutTotal(stats.leftOut));
  if (values.json) {
    io.out(JSON.stringify({
      students: students.map((r, i) => studentJson(book, r, i)),
      sections,
      course,
      planProblems,
      importWarnings: imported.problems.filter((p) => p.severity === 'warning').map((p) => p.message),
    }, null, 2));
    return EXIT_OK;
  }
  io.out(table(
    ['ID', 'Name', 'Section', 'Final %', 'Letter'],
    students.map((r, i) => [r.studentId, book.students[i]?.name ?? '', r.section, fmt(r.final), r.letter ?? '—']),
  ));
  io.out('');
  printStatistics(io, sections, course);
  return EXIT_OK;
}

type SectionJson = ReturnType<typeof sectionJson>;

function printStatistics(io: CliIo, sections: readonly SectionJson[], course: SectionJson): void {
  const statRows = [...sections, course].map((s) => [
    s.section ?? 'All sections', String(s.n), fmt(s.mean), fmt(s.median), fmt(s.sd), fmt(s.q1), fmt(s.q3),
    s.outliers.map((o) => o.id).join(' ') || '—',
  ]);
  io.out(table(['Section', 'n', 'Mean', 'Median', 'SD (n−1)', 'Q1', 'Q3', 'Outliers'], statRows));
  io.out(`Quartiles: ${course.quantileMethod}; outliers beyond Q1 − 1.5·IQR or Q3 + 1.5·IQR (Tukey).`);
}

/** Text gradebooks larger than this (bytes) are streamed; `WEIGHBRIDGE_STREAM_ABOVE` overrides it. */
const STREAM_ABOVE = 16 * 2 ** 20;
/** Largest gradebook for which --out .xlsx / --extras (which need the whole course) are accepted. */
const IN_MEMORY_LIMIT = 256 * 2 ** 20;

function streamThreshold(): number {
  const raw = process.env['WEIGHBRIDGE_STREAM_ABOVE'];
  if (raw === undefined || raw.trim() === '') return STREAM_ABOVE;
  const n = Number(raw);
  if (!Number.isFinite(n) || n < 0) throw new UsageError(`WEIGHBRIDGE_STREAM_ABOVE must be a number of bytes (0 or more); got "${raw}".`);
  return n;
}

interface StreamOptions {
  readonly out: string | undefined;
  readonly overwrite: boolean;
  readonly json: boolean;
  readonly quantileType: QuantileType;
}

/**
 * `grade` on a large .csv/.tsv without holding the gradebook: rows are streamed from the file
 * (spreadsheet service streamImportText: layout detected on the first rows, every problem located
 * as in the in-memory import) into the engine's createStreamGrader (property-tested equal to
 * gradeCourse); sectionFinalStatistics gives the statistics. The output is the in-memory path's,
 * byte for byte (tests/cli/streaming.test.ts), written in blocks. Kept per student: the Student,
 * 8 bytes of percent, a status byte per category; a Set of IDs while reading.
 * Returns null when the file must be imported in memory after all.
 */
async function gradeStreamed(path: string, planPath: string, options: StreamOptions, io: CliIo): Promise<number | null> {
  const plan = await loadPlanFile(planPath);
  // A plan error is reported after the import's errors: the in-memory path keeps that order.
  if (!plan.ok) return null;
  if (io.progress) io.err(`Reading ${basename(path)} row by row…`);
  let grader: StreamGrader | null = null;
  let layout: readonly CategoryLayout[] = [];
  let noMark = new Map<number, string>();
  let rows = 0;
  const streamed = await streamImportText(path, {
    begin(assessments) {
      grader = createStreamGrader(assessments, plan.value);
      layout = layoutFor({ students: [], assessments, scores: [] }, plan.value);
      noMark = new Map();
      rows = 0;
    },
    row(student, scores) {
      const g = grader!;
      fillRow(g.row, scores);
      // Why there is no mark, in the plain engine's words (rare: only for such students).
      if (!g.add(student)) noMark.set(rows, weighStudent(student, scores, layout, plan.value).noMarkReason ?? '');
      rows++;
      if (io.progress && rows % 100_000 === 0) io.err(`  ${rows} rows graded…`);
    },
  });
  if (streamed === null) return null;
  if (!streamed.ok) {
    const errors = (streamed.problems ?? []).filter((p) => p.severity === 'error');
    throw new InputError([streamed.message, ...problemLines(errors).slice(1)].join('\n'));
  }
  const started: StreamGrader | null = grader;
  if (started === null) return null;
  const { course, grades } = (started as StreamGrader).finish();
  const { assessments, problems } = streamed.value;
  const students = course.students;
  const S = course.studentCount;
  // checkPlan reads the score rows only for points that are not finite or negative, which the
  // import never lets through, and compares their count with the roster's: an array of that length
  // with no rows in it (forEach skips holes) gives it the count without holding the scores.
  const planProblems = [...checkPlan({ students, assessments, scores: new Array<Score[]>(S) }, plan.value), ...grades.problems];
  for (const p of problemLines(problems)) io.err(p);
  for (const p of planProblems) io.err(`plan: ${p}`);

  const { cutoffs } = course.compiled;
  const finalOf = (s: number): number | null => (grades.final[s] === grades.final[s] ? grades.final[s]! : null);
  const cutoffOf = (s: number) => (finalOf(s) === null || grades.letter[s]! < 0 ? undefined : cutoffs[grades.letter[s]!]);

  if (options.out !== undefined) {
    const written = await exportCsvRows(
      { path: options.out, sourcePath: path, projectPath: planPath, overwrite: options.overwrite },
      EXPORT_COLUMNS.map((c) => c.header),
      S,
      (s) => {
        const st = students[s]!;
        const cutoff = cutoffOf(s);
        return [st.id, st.name, st.section, finalOf(s), cutoff?.letter ?? null, cutoff?.gradePoints ?? null];
      },
    );
    if (!written.ok) throw new InputError(written.code === 'exists' ? `${written.message} (use --overwrite)` : written.message);
    io.err(`Wrote ${written.value.rows} final marks to ${written.value.path}. The file holds identifiable student data.`);
  }

  const stats = sectionFinalStatistics(course, grades, { quantileType: options.quantileType });
  // Roster indices of each group's values (students with a mark, roster order), as sectionStatistics keeps them.
  const indicesBy = new Map<string, number[]>();
  const courseIndices: number[] = [];
  for (let s = 0; s < S; s++) {
    if (finalOf(s) === null) continue;
    const section = students[s]!.section;
    let list = indicesBy.get(section);
    if (list === undefined) indicesBy.set(section, (list = []));
    list.push(s);
    courseIndices.push(s);
  }
  const idOf = (i: number) => students[i]?.id ?? '';
  const sections = stats.sections.map((g) => sectionJson(idOf, g.section, g.summary, indicesBy.get(g.section ?? '') ?? [], g.noMark));
  const courseJson = sectionJson(idOf, null, stats.course.summary, courseIndices, stats.course.noMark);

  if (options.json) {
    const studentAt = (s: number) => {
      const st = students[s]!;
      const final = finalOf(s);
      const cutoff = cutoffOf(s);
      const notes: Record<string, string> = {};
      const weighted = grades.hasWeighted[s] === 1 ? grades.weighted[s]! : null;
      const effectiveWeights = effectiveWeightsOf(course, grades, s);
      if (weighted === null) notes['final'] = noMark.get(s) ?? '';
      else if (final === null || cutoff === undefined) {
        // finishStudent words the reason (adjusted percent not a number, or below every cutoff).
        const result = finishStudent(st, { weighted, effectiveWeights, lines: [], noMarkReason: null }, grades.adjusted[s]!, [], plan.value);
        const line = result.lines.find((l) => l.kind === 'noMark');
        if (line?.kind === 'noMark') notes[final === null ? 'final' : 'letter'] = line.reason;
      }
      return { id: st.id, name: st.name, section: st.section, final, letter: cutoff?.letter ?? null, gradePoints: cutoff?.gradePoints ?? null, weighted, effectiveWeights, notes };
    };
    // JSON.stringify(whole, null, 2) written piece by piece: each student is indented two levels.
    const rest = JSON.stringify(
      { sections, course: courseJson, planProblems, importWarnings: problems.filter((p) => p.severity === 'warning').map((p) => p.message) },
      null,
      2,
    );
    io.out('{');
    if (S === 0) io.out('  "students": [],');
    else {
      io.out('  "students": [');
      for (let i = 0; i < S; i += OUTPUT_BLOCK) {
        const block: string[] = [];
        const end = Math.min(S, i + OUTPUT_BLOCK);
        for (let s = i; s < end; s++) block.push(`    ${JSON.stringify(studentAt(s), null, 2).replace(/\n/g, '\n    ')}${s + 1 < S ? ',' : ''}`);
        io.out(block.join('\n'));
        await io.drain?.();
      }
      io.out('  ],');
    }
    io.out(rest.slice(2));
    return EXIT_OK;
  }
  await writeTable(io, ['ID', 'Name', 'Section', 'Final %', 'Letter'], S, (s) => {
    const st = students[s]!;
    return [st.id, st.name, st.section, fmt(finalOf(s)), cutoffOf(s)?.letter ?? '—'];
  });
  io.out('');
  printStatistics(io, sections, courseJson);
  return EXIT_OK;
}

async function projectFor(path: string, gradebook: Gradebook, layout: ImportLayout, plan: GradingPlan): Promise<CourseProject> {
  const bytes = await readFile(path);
  return {
    title: basename(path),
    gradebook,
    plan,
    source: { path, fileName: basename(path), sha256: createHash('sha256').update(bytes).digest('hex'), importedAt: new Date().toISOString(), layout },
    notes: '',
  };
}

// ---------------------------------------------------------------------------------------------
// stats
// ---------------------------------------------------------------------------------------------

async function readStatsColumn(path: string, column: string, by: string | undefined, sheet: string | undefined) {
  const read = await readColumn(path, { column, ...(by !== undefined ? { by } : {}), ...(sheet !== undefined ? { sheet } : {}) });
  if (!read.ok) {
    const lines = read.problems ? problemLines(read.problems.slice(1)) : [];
    throw new InputError([read.message, ...lines].join('\n'));
  }
  return read.value;
}

/** The statistics object of `stats --json` (keys as in docs/cli.md). */
function statsJson(summary: Summary, rows: readonly number[]) {
  const fields = {
    mean: summary.mean, median: summary.median, modes: summary.modes, min: summary.min, max: summary.max, range: summary.range,
    variance: summary.sampleVariance, sd: summary.sampleSd, populationVariance: summary.populationVariance, populationSd: summary.populationSd,
    cv: summary.cv, q1: summary.q1, q3: summary.q3, iqr: summary.iqr, lowerFence: summary.lowerFence, upperFence: summary.upperFence,
  };
  return {
    n: summary.n,
    mean: valueOf(summary.mean),
    median: valueOf(summary.median),
    modes: valueOf(summary.modes),
    min: valueOf(summary.min),
    max: valueOf(summary.max),
    range: valueOf(summary.range),
    variance: valueOf(summary.sampleVariance),
    sd: valueOf(summary.sampleSd),
    populationVariance: valueOf(summary.populationVariance),
    populationSd: valueOf(summary.populationSd),
    cv: valueOf(summary.cv),
    q1: valueOf(summary.q1),
    q3: valueOf(summary.q3),
    iqr: valueOf(summary.iqr),
    lowerFence: valueOf(summary.lowerFence),
    upperFence: valueOf(summary.upperFence),
    outliers: summary.outliers.map((o) => ({ label: o.label, row: rows[o.index] ?? null, value: o.value, side: o.side })),
    quantileType: summary.quantileType,
    quantileMethod: summary.quantileMethod,
    notes: notesOf(fields),
  };
}

function statsText(title: string, s: ReturnType<typeof statsJson>): string {
  const v = (x: number | null) => (x === null ? '—' : String(x));
  const lines = [
    title,
    `  n                    ${s.n}`,
    `  mean                 ${v(s.mean)}`,
    `  median               ${v(s.median)}`,
    `  modes                ${s.modes === null ? '—' : s.modes.join(', ')}`,
    `  min / max / range    ${v(s.min)} / ${v(s.max)} / ${v(s.range)}`,
    `  variance, sd (n−1)   ${v(s.variance)}, ${v(s.sd)}`,
    `  population var, sd   ${v(s.populationVariance)}, ${v(s.populationSd)}`,
    `  cv                   ${v(s.cv)}`,
    `  q1 / q3 / iqr        ${v(s.q1)} / ${v(s.q3)} / ${v(s.iqr)}   (${s.quantileMethod})`,
    `  fences               ${v(s.lowerFence)} / ${v(s.upperFence)}`,
    `  outliers             ${s.outliers.length === 0 ? 'none' : s.outliers.map((o) => `${o.label} (${o.value})`).join(', ')}`,
  ];
  for (const [field, reason] of Object.entries(s.notes)) lines.push(`  note: ${field} not defined — ${reason}`);
  return lines.join('\n');
}

async function stats(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args, {
    column: { type: 'string' },
    by: { type: 'string' },
    sheet: { type: 'string' },
    json: { type: 'boolean' },
    'quantile-type': { type: 'string' },
  }, 'stats');
  if (values.help) return help('stats', io);
  const path = onePositional(positionals, 'file', 'stats');
  if (values.column === undefined || values.column.trim() === '') throw new UsageError('stats needs --column <header of a numeric column>.');
  const quantileType = quantileTypeOption(values['quantile-type']);
  if (io.progress) io.err(`Reading ${basename(path)}…`);
  const col = await readStatsColumn(path, values.column, values.by, values.sheet);
  const overall = statsJson(describe(col.values.map((v) => v.value), { quantileType, labels: col.values.map((v) => v.label) }), col.values.map((v) => v.row));
  const skipped = {
    blank: col.skipped.filter((s) => s.reason === 'blank').length,
    tokens: col.skipped.filter((s) => s.reason === 'token').length,
  };
  if (values.by === undefined) {
    if (values.json) io.out(JSON.stringify({ file: basename(path), sheet: col.sheet, column: values.column, skipped, ...overall }, null, 2));
    else io.out(statsText(`${values.column} (sheet "${col.sheet}")`, overall));
    return EXIT_OK;
  }
  const names: string[] = [];
  for (const v of col.values) if (v.group !== null && !names.includes(v.group)) names.push(v.group);
  const groups = names.map((name) => {
    const members = col.values.filter((v) => v.group === name);
    const summary = describe(members.map((v) => v.value), { quantileType, labels: members.map((v) => v.label) });
    return { group: name, ...statsJson(summary, members.map((v) => v.row)) };
  });
  if (values.json) {
    io.out(JSON.stringify({ file: basename(path), sheet: col.sheet, column: values.column, by: values.by, skipped, groups, overall }, null, 2));
  } else {
    io.out([...groups.map((g) => statsText(`${values.column} — ${values.by} ${g.group}`, g)), statsText(`${values.column} — all`, overall)].join('\n\n'));
  }
  return EXIT_OK;
}

// ---------------------------------------------------------------------------------------------
// check, init-plan
// ---------------------------------------------------------------------------------------------

async function check(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args, { json: { type: 'boolean' } }, 'check');
  if (values.help) return help('check', io);
  const path = onePositional(positionals, 'gradebook file', 'check');
  if (io.progress) io.err(`Reading ${basename(path)}…`);
  const imported = await detectAndImport(path);
  if (!imported.ok) {
    if (values.json) io.out(JSON.stringify({ ok: false, code: imported.code, message: imported.message, problems: imported.problems ?? [] }, null, 2));
    io.err(imported.message);
    for (const line of problemLines((imported.problems ?? []).slice(1))) io.err(line);
    return EXIT_BAD_INPUT;
  }
  const { gradebook, layout, problems } = imported.value;
  const sections = [...new Set(gradebook.students.map((s) => s.section))];
  if (values.json) {
    io.out(JSON.stringify({
      ok: true,
      students: gradebook.students.length,
      assessments: gradebook.assessments.map((a) => ({ id: a.id, name: a.name, possible: a.possible })),
      sections,
      layout,
      problems,
    }, null, 2));
    return EXIT_OK;
  }
  io.out(`${basename(path)}: ${gradebook.students.length} students, ${gradebook.assessments.length} assessments, sections ${sections.map((s) => `"${s}"`).join(', ')}.`);
  for (const s of layout.sheets) io.out(`Sheet "${s.sheet}": header row ${s.headerRow + 1}${s.possibleRow === null ? '' : `, points possible in row ${s.possibleRow + 1}`}.`);
  for (const a of gradebook.assessments) io.out(`  ${a.name} (${a.possible} points)`);
  io.out(problems.length === 0 ? 'No problems found.' : `${problems.length} warning${problems.length === 1 ? '' : 's'}:`);
  for (const line of problemLines(problems)) io.out(`  ${line}`);
  return EXIT_OK;
}

async function initPlan(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args, { out: { type: 'string' }, overwrite: { type: 'boolean' } }, 'init-plan');
  if (values.help) return help('init-plan', io);
  const path = onePositional(positionals, 'gradebook file', 'init-plan');
  if (values.overwrite && values.out === undefined) throw new UsageError('--overwrite goes with --out <file>.');
  const imported = await importGradebook(path, io);
  const plan = suggestPlan(imported.gradebook);
  if (values.out === undefined) {
    io.out(serialisePlan(plan).trimEnd());
    return EXIT_OK;
  }
  if (await sameFile(values.out, path)) throw new InputError(`"${values.out}" is the gradebook itself; Weighbridge never writes it. Choose another name for the plan file.`);
  const exists = await stat(values.out).then(() => true, () => false);
  if (exists && !values.overwrite) throw new InputError(`"${values.out}" already exists; use --overwrite to replace it (the old file is kept as .bak).`);
  const saved = await savePlanFile(values.out, plan);
  if (!saved.ok) throw new InputError(saved.message);
  io.err(`Wrote a starting plan with ${plan.categories.length} categories to ${values.out}. Review the categories, weights and scale against the syllabus.`);
  return EXIT_OK;
}

function help(command: string, io: CliIo): number {
  io.out(HELP[command] ?? HELP['main'] ?? '');
  return EXIT_OK;
}

// ---------------------------------------------------------------------------------------------
// Entry
// ---------------------------------------------------------------------------------------------

const COMMANDS: Record<string, (args: readonly string[], io: CliIo) => Promise<number>> = {
  grade,
  stats,
  check,
  'init-plan': initPlan,
};

export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = argv;
  try {
    if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
      if (command === undefined) {
        io.err(HELP['main'] ?? '');
        return EXIT_USAGE;
      }
      return help(rest[0] !== undefined && HELP[rest[0]] ? rest[0] : 'main', io);
    }
    if (command === '--version' || command === '-v') {
      io.out(pkg.version);
      return EXIT_OK;
    }
    const run = COMMANDS[command];
    if (!run) throw new UsageError(`Unknown command "${command}". Commands: ${Object.keys(COMMANDS).join(', ')}. See: weighbridge --help`);
    return await run(rest, io);
  } catch (error) {
    if (error instanceof UsageError) {
      io.err(`weighbridge: ${error.message}`);
      return EXIT_USAGE;
    }
    if (error instanceof InputError) {
      io.err(`weighbridge: ${error.message}`);
      return EXIT_BAD_INPUT;
    }
    throw error;
  }
}

function isMainModule(): boolean {
  const entry = process.argv[1];
  if (entry === undefined) return false;
  try {
    return realpathSync(entry) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isMainModule()) {
  const io: CliIo = {
    out: (text) => process.stdout.write(`${text}\n`),
    err: (text) => process.stderr.write(`${text}\n`),
    progress: process.stderr.isTTY === true,
    drain: () => (process.stdout.writableNeedDrain ? new Promise<void>((resolve) => process.stdout.once('drain', () => resolve())) : Promise.resolve()),
  };
  runCli(process.argv.slice(2), io).then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      process.stderr.write(`weighbridge: unexpected error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
      process.exitCode = 70;
    },
  );
}
