/**
 * Final-marks export (.xlsx or .csv) with the columns, headers and order the user chose, plus
 * optional extras: per-student breakdown, section statistics, assessment statistics — extra sheets
 * in an xlsx file, sibling files beside a CSV (`<name>.breakdown.csv`, `<name>.sections.csv`,
 * `<name>.assessments.csv`).
 *
 * Safety: never writes the course's source spreadsheet or a Weighbridge project file (the open one
 * named by `request.projectPath`, checked by path and file identity; any other by its content); an
 * existing file is replaced only when the user has confirmed (`overwrite`), otherwise code
 * 'exists'. Every file is written atomically.
 */
import { open } from 'node:fs/promises';
import { basename, extname } from 'node:path';
import type { ExportRequest, Failure, Result } from '../../../renderer/bridge/contract';
import { sameFile, writeAtomic } from '../project/atomicWrite';
import { fail, ioFailure, ok } from '../project/result';
import { describeIssues, exportRequestSchema } from '../schemas';
import { assessmentStatisticsTable, breakdownTable, finalsTable, gradeProject, gradeProjectFinalsOnly, sectionStatisticsTable, type GradedCourse, type Table } from './tables';
import { tableToCsv, tablesToXlsx } from './writers';

export interface ExportOutcome {
  readonly path: string;
  /** Student rows in the final-marks table. */
  readonly rows: number;
}

/** The CSV sibling files for the optional tables. */
export function csvSiblingPath(path: string, suffix: 'breakdown' | 'sections' | 'assessments'): string {
  const ext = extname(path);
  const stem = ext === '' ? path : path.slice(0, -ext.length);
  return `${stem}.${suffix}${ext === '' ? '.csv' : ext}`;
}

/** The first bytes of an existing file, or null when it does not exist. */
async function head(path: string): Promise<Buffer | null> {
  try {
    const handle = await open(path, 'r');
    try {
      const buffer = Buffer.alloc(4096);
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
      return buffer.subarray(0, bytesRead);
    } finally {
      await handle.close();
    }
  } catch (error) {
    if (typeof error === 'object' && error !== null && (error as { code?: unknown }).code === 'ENOENT') return null;
    throw error;
  }
}

const PROJECT_MARKER = /"format"\s*:\s*"weighbridge-(project|plan|recovery)"/;

/**
 * Refuses a target that is the source spreadsheet, the open project/plan file, any Weighbridge
 * project or plan file, or (without `overwrite`) any existing file. Null when all may be written.
 * @throws {Error} on an I/O error other than "does not exist" (the caller words it)
 */
export async function checkTargets(paths: readonly string[], sourcePath: string | null, projectPath: string | null, overwrite: boolean): Promise<Failure | null> {
  for (const path of paths) {
    const name = basename(path);
    if (sourcePath !== null && (await sameFile(path, sourcePath))) {
      return fail('bad-input', `"${name}" is the course's source spreadsheet; Weighbridge never writes it. Choose another file name for the export.`);
    }
    if (projectPath && (await sameFile(path, projectPath))) {
      return fail('bad-input', `"${name}" is the open project file; an export would replace the course. Choose another file name for the export.`);
    }
    const existing = await head(path);
    if (existing !== null) {
      if (PROJECT_MARKER.test(existing.toString('utf8'))) {
        return fail('bad-input', `"${name}" is a Weighbridge project or plan file; an export would replace it. Choose another file name for the export.`);
      }
      if (!overwrite) return fail('exists', `"${name}" already exists. Confirm that it may be replaced, or choose another file name.`);
    }
  }
  return null;
}

/**
 * For direct callers (the CLI, tests, anything that did not come through IPC): validates the whole
 * request with zod (every score of the project), then writeExport.
 */
export async function exportFinals(request: ExportRequest, graded?: GradedCourse): Promise<Result<ExportOutcome>> {
  const valid = exportRequestSchema.safeParse(request);
  if (!valid.success) return fail('bad-input', `The export was not written: ${describeIssues(valid.error, ['request'])}.`);
  return writeExport(request, graded);
}

/**
 * The export of a request that is ALREADY VALID — the IPC dispatch checks every payload against
 * main/ipc/argSchemas.ts (exportRequestSchema plus absolute paths) before a handler runs, so
 * validating again there would walk every score twice. Anything else calls exportFinals.
 *
 * `graded` may be passed by a caller that has graded the course already; it must be the grading
 * of `request.project` (with explanation lines when the breakdown is included). Without it the
 * course is graded here: with the fast path when no table shows explanation lines, with the plain
 * gradeCourse when the breakdown is asked for.
 */
export async function writeExport(request: ExportRequest, graded?: GradedCourse): Promise<Result<ExportOutcome>> {
  const { path, format, project, include, projectPath } = request;
  const ext = extname(path).toLowerCase();
  if (ext !== `.${format}`) {
    return fail('bad-input', `The file name "${basename(path)}" does not end in .${format}; choose a name ending in .${format} for this export.`);
  }
  const results = graded ?? (include.breakdown ? gradeProject(project) : gradeProjectFinalsOnly(project));
  const finals = finalsTable(project.gradebook, results, request.columns);
  const extras: { suffix: 'breakdown' | 'sections' | 'assessments'; table: Table }[] = [];
  if (include.breakdown) extras.push({ suffix: 'breakdown', table: breakdownTable(project, results) });
  if (include.sectionStatistics) extras.push({ suffix: 'sections', table: sectionStatisticsTable(project.gradebook, results) });
  if (include.assessmentStatistics) extras.push({ suffix: 'assessments', table: assessmentStatisticsTable(project.gradebook, project.plan, results) });

  const files: { path: string; data: string | Buffer }[] =
    format === 'xlsx'
      ? [{ path, data: tablesToXlsx([finals, ...extras.map((e) => e.table)]) }]
      : [{ path, data: tableToCsv(finals) }, ...extras.map((e) => ({ path: csvSiblingPath(path, e.suffix), data: tableToCsv(e.table) }))];

  try {
    // Check every target before writing any, so a refusal leaves nothing half-exported.
    const refused = await checkTargets(files.map((f) => f.path), project.source?.path ?? null, projectPath ?? null, request.overwrite);
    if (refused !== null) return refused;
    for (const file of files) await writeAtomic(file.path, file.data);
  } catch (error) {
    return ioFailure('Exporting the final marks', path, error);
  }
  return ok({ path, rows: finals.rows.length });
}
