/**
 * The recovery copy: the open course written to the app's data folder on change (the caller
 * debounces), offered on the next start after a crash, discarded after a clean save or close.
 *
 * File `<dir>/recovery.json`: `{ "format": "weighbridge-recovery", "schemaVersion": 1, "savedAt",
 * "projectPath", "project" }`, written atomically. A damaged copy is reported (code 'damaged'),
 * never loaded.
 */
import { mkdir, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { z } from 'zod';
import type { CourseProject, RecoveryInfo, Result } from '../../../renderer/bridge/contract';
import { readTextFile } from './readText';
import { writeAtomic } from '../project/atomicWrite';
import { fail, ioFailure, ok } from '../project/result';
import { parseVersioned, type VersionedFormat } from '../project/versionedFile';
import { courseProjectSchema, describeIssues, isoTimestampSchema } from '../schemas';

export const RECOVERY_FORMAT = 'weighbridge-recovery';
export const RECOVERY_FILE_NAME = 'recovery.json';

const recoveryDocumentSchema = z.strictObject({
  format: z.literal(RECOVERY_FORMAT),
  schemaVersion: z.literal(1),
  savedAt: isoTimestampSchema,
  projectPath: z.string().min(1).nullable(),
  project: courseProjectSchema,
});

const recoveryFormat: VersionedFormat<z.output<typeof recoveryDocumentSchema>> = {
  format: RECOVERY_FORMAT,
  label: 'recovery copy',
  currentVersion: 1,
  migrations: {},
  schema: recoveryDocumentSchema,
};

export interface RecoveryStore {
  write(projectPath: string | null, project: CourseProject): Promise<Result<{ savedAt: string }>>;
  /** write() of a project given as JSON text (what the renderer sends); refused unless it parses and validates. */
  writeJson(projectPath: string | null, projectJson: string): Promise<Result<{ savedAt: string }>>;
  /** The recovery copy, null when there is none; a damaged copy is a failure, not a half-load. */
  read(): Promise<Result<RecoveryInfo | null>>;
  discard(): Promise<Result<null>>;
}

export function createRecoveryStore(dir: string, now: () => Date = () => new Date()): RecoveryStore {
  const file = join(dir, RECOVERY_FILE_NAME);
  const store: RecoveryStore = {
    async write(projectPath, project) {
      const valid = courseProjectSchema.safeParse(project);
      if (!valid.success) return fail('bad-input', `The recovery copy was not written: ${describeIssues(valid.error, ['project'])}.`);
      const savedAt = now().toISOString();
      const doc = { format: RECOVERY_FORMAT, schemaVersion: 1, savedAt, projectPath, project };
      try {
        await mkdir(dir, { recursive: true });
        await writeAtomic(file, `${JSON.stringify(doc)}\n`);
      } catch (error) {
        return ioFailure('Writing the recovery copy', file, error);
      }
      return ok({ savedAt });
    },
    async writeJson(projectPath, projectJson) {
      let project: unknown;
      try {
        project = JSON.parse(projectJson);
      } catch {
        return fail('bad-input', 'The recovery copy was not written: the course sent for it is not valid JSON.');
      }
      return store.write(projectPath, project as CourseProject); // write() validates it
    },
    async read() {
      const text = await readTextFile(file, 'recovery copy');
      if (!text.ok) return text.code === 'not-found' ? ok(null) : text;
      const parsed = parseVersioned(text.value, recoveryFormat, 'The recovery copy');
      if (!parsed.ok) return parsed;
      const { savedAt, projectPath, project } = parsed.value.document;
      return ok({ savedAt, projectPath, project });
    },
    async discard() {
      try {
        await rm(file, { force: true });
      } catch (error) {
        return ioFailure('Discarding the recovery copy', file, error);
      }
      return ok(null);
    },
  };
  return store;
}
