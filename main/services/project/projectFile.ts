/**
 * The project file: one JSON document holding the whole course (roster, scores, import mapping,
 * plan, scale, adjustments, notes).
 *
 * ```json
 * { "format": "weighbridge-project", "schemaVersion": 1, "savedAt": "2025-01-31T12:00:00.000Z",
 *   "project": { "title": …, "gradebook": …, "plan": …, "source": …, "notes": … } }
 * ```
 *
 * Saving: validate, refuse the source spreadsheet's path, keep the file being replaced as
 * `<name>.bak` when it is a valid project (a damaged file never replaces a good backup), then
 * replace the file atomically (temp + fsync + rename + fsync directory). Loading: validate every
 * field after migrating older schema versions; anything wrong refuses the whole file.
 */
import { readFile, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { z } from 'zod';
import type { CourseProject, Result } from '../../../renderer/bridge/contract';
import { courseProjectSchema, describeIssues, isoTimestampSchema } from '../schemas';
import { keepBackup, sameFile, writeAtomic } from './atomicWrite';
import { fail, ioFailure, ok } from './result';
import { MAX_JSON_FILE_BYTES, parseVersioned, type Migration, type VersionedFormat } from './versionedFile';

export const PROJECT_FORMAT = 'weighbridge-project';
export const PROJECT_SCHEMA_VERSION = 1;
/** Suggested extension for project files (the save dialog proposes it). */
export const PROJECT_FILE_EXTENSION = '.weighbridge';

/**
 * Upgrades of older project files, keyed by the version they upgrade from. Version 1 is the first
 * published schema, so the table is empty; the mechanism is exercised by the tests with a table of
 * their own (see tests/services/project/versionedFile.test.ts).
 */
export const projectMigrations: Readonly<Record<number, Migration>> = {};

export const projectDocumentSchema = z.strictObject({
  format: z.literal(PROJECT_FORMAT),
  schemaVersion: z.literal(PROJECT_SCHEMA_VERSION),
  savedAt: isoTimestampSchema,
  project: courseProjectSchema,
});

export type ProjectDocument = z.output<typeof projectDocumentSchema>;

export const projectFormat: VersionedFormat<ProjectDocument> = {
  format: PROJECT_FORMAT,
  label: 'project file',
  currentVersion: PROJECT_SCHEMA_VERSION,
  migrations: projectMigrations,
  schema: projectDocumentSchema,
  otherFormats: { 'weighbridge-plan': 'grading plan file', 'weighbridge-recovery': 'recovery copy' },
};

/** Parse the text of a project file. */
export function parseProjectText(text: string, name?: string): Result<CourseProject> {
  const parsed = parseVersioned(text, projectFormat, name);
  return parsed.ok ? ok(parsed.value.document.project) : parsed;
}

/** The exact text a save writes (2-space JSON, trailing newline). */
export function serialiseProject(project: CourseProject, savedAt: string): string {
  const doc = { format: PROJECT_FORMAT, schemaVersion: PROJECT_SCHEMA_VERSION, savedAt, project };
  return `${JSON.stringify(doc, null, 2)}\n`;
}

export function backupPathFor(path: string): string {
  return `${path}.bak`;
}

async function readJsonFile(path: string, label: string): Promise<Result<string>> {
  try {
    const info = await stat(path);
    if (info.isDirectory()) return fail('bad-input', `"${path}" is a folder, not a ${label}. Choose a file.`);
    if (info.size > MAX_JSON_FILE_BYTES) {
      return fail('bad-input', `"${path}" is ${Math.round(info.size / 1048576)} MB, larger than any ${label} (limit ${MAX_JSON_FILE_BYTES / 1048576} MB). Choose the right file.`);
    }
    const bytes = await readFile(path);
    try {
      return ok(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
    } catch {
      return fail('damaged', `The ${label} "${basename(path)}" is damaged and was not opened: it is not UTF-8 text. The file was not changed.`);
    }
  } catch (error) {
    return ioFailure(`Opening the ${label}`, path, error);
  }
}

export async function loadProject(path: string): Promise<Result<CourseProject>> {
  const text = await readJsonFile(path, 'project file');
  if (!text.ok) return text;
  return parseProjectText(text.value, `The project file "${basename(path)}"`);
}

export interface SaveOptions {
  /** Clock for `savedAt` (tests). */
  readonly now?: () => Date;
}

export async function saveProject(path: string, project: CourseProject, options: SaveOptions = {}): Promise<Result<{ path: string; savedAt: string }>> {
  const valid = courseProjectSchema.safeParse(project);
  if (!valid.success) {
    return fail('bad-input', `The course was not saved because it is not consistent: ${describeIssues(valid.error, ['project'])}.`);
  }
  if (project.source && (await sameFile(path, project.source.path))) {
    return fail('bad-input', `"${basename(path)}" is the course's source spreadsheet; Weighbridge never writes it. Save the project under another name.`);
  }
  const savedAt = (options.now?.() ?? new Date()).toISOString();
  const text = serialiseProject(project, savedAt);
  try {
    await keepBackup(path, backupPathFor(path), (bytes) => parseProjectText(bytes.toString('utf8')).ok);
    await writeAtomic(path, text);
  } catch (error) {
    return ioFailure('Saving the project', path, error);
  }
  return ok({ path, savedAt });
}
