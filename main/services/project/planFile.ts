/**
 * The grading-plan file: a plan on its own, to reuse across terms and to drive the command line.
 *
 * ```json
 * { "format": "weighbridge-plan", "schemaVersion": 1, "plan": { "categories": […], "items": {…}, … } }
 * ```
 *
 * Same rules as the project file: strict validation after migration, atomic replacement, the
 * previous good copy kept as `<name>.bak`.
 */
import { readFile, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { z } from 'zod';
import type { Result } from '../../../renderer/bridge/contract';
import type { GradingPlan } from '../../../renderer/engine/model';
import { describeIssues, gradingPlanSchema } from '../schemas';
import { keepBackup, writeAtomic } from './atomicWrite';
import { fail, ioFailure, ok } from './result';
import { MAX_JSON_FILE_BYTES, parseVersioned, type Migration, type VersionedFormat } from './versionedFile';

export const PLAN_FORMAT = 'weighbridge-plan';
export const PLAN_SCHEMA_VERSION = 1;

/** Version 1 is the first plan-file schema; upgrades from later versions go here. */
export const planMigrations: Readonly<Record<number, Migration>> = {};

export const planDocumentSchema = z.strictObject({
  format: z.literal(PLAN_FORMAT),
  schemaVersion: z.literal(PLAN_SCHEMA_VERSION),
  plan: gradingPlanSchema,
});

export type PlanDocument = z.output<typeof planDocumentSchema>;

export const planFormat: VersionedFormat<PlanDocument> = {
  format: PLAN_FORMAT,
  label: 'plan file',
  currentVersion: PLAN_SCHEMA_VERSION,
  migrations: planMigrations,
  schema: planDocumentSchema,
  otherFormats: { 'weighbridge-project': 'project file' },
};

export function parsePlanText(text: string, name?: string): Result<GradingPlan> {
  const parsed = parseVersioned(text, planFormat, name);
  return parsed.ok ? ok(parsed.value.document.plan) : parsed;
}

export function serialisePlan(plan: GradingPlan): string {
  const doc = { format: PLAN_FORMAT, schemaVersion: PLAN_SCHEMA_VERSION, plan };
  return `${JSON.stringify(doc, null, 2)}\n`;
}

export async function loadPlanFile(path: string): Promise<Result<GradingPlan>> {
  try {
    const info = await stat(path);
    if (info.isDirectory()) return fail('bad-input', `"${path}" is a folder, not a plan file. Choose a file.`);
    if (info.size > MAX_JSON_FILE_BYTES) return fail('bad-input', `"${path}" is too large to be a plan file. Choose the right file.`);
    const bytes = await readFile(path);
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      return fail('damaged', `The plan file "${basename(path)}" is damaged and was not opened: it is not UTF-8 text.`);
    }
    return parsePlanText(text, `The plan file "${basename(path)}"`);
  } catch (error) {
    return ioFailure('Opening the plan file', path, error);
  }
}

export async function savePlanFile(path: string, plan: GradingPlan): Promise<Result<{ path: string }>> {
  const valid = gradingPlanSchema.safeParse(plan);
  if (!valid.success) return fail('bad-input', `The plan was not saved because it is not consistent: ${describeIssues(valid.error, ['plan'])}.`);
  try {
    await keepBackup(path, `${path}.bak`, (bytes) => parsePlanText(bytes.toString('utf8')).ok);
    await writeAtomic(path, serialisePlan(plan));
  } catch (error) {
    return ioFailure('Saving the plan file', path, error);
  }
  return ok({ path });
}
