/**
 * Schemas for what the parsing worker sends back. Its output is data derived from an untrusted
 * file, produced in another thread: nothing of it reaches the rest of the app before it has
 * passed these (strict objects, so no extra key — `__proto__` included — is carried along).
 *
 * Built from main/services/schemas.ts. Points possible ≤ 0 is allowed in layouts here, as in the
 * spreadsheet service, because the import reports it at its column in the user's words.
 */
import { z } from 'zod';
import type { ImportLayout, WorkbookPreview } from '../../../renderer/bridge/contract';
import type { Gradebook } from '../../../renderer/engine/model';
import type { ImportOutcome } from '../spreadsheet';
import { columnLayoutSchema, gradebookSchema, importLayoutSchema, importProblemSchema, sheetLayoutSchema, textEncodingSchema } from '../schemas';

const count = z.number().int().nonnegative();

const workerColumnLayoutSchema = columnLayoutSchema.extend({ possible: z.number().finite().optional() });
const workerSheetLayoutSchema = sheetLayoutSchema.extend({ columns: z.array(workerColumnLayoutSchema) });
export const workerLayoutSchema = importLayoutSchema.extend({ sheets: z.array(workerSheetLayoutSchema) });

export const sheetPreviewSchema = z.strictObject({
  name: z.string(),
  rows: z.array(z.array(z.string())),
  totalRows: count,
  totalColumns: count,
});

export const workbookPreviewSchema = z.strictObject({
  path: z.string(),
  fileName: z.string(),
  format: z.enum(['xlsx', 'xls', 'ods', 'csv', 'tsv']),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  encoding: textEncodingSchema.optional(),
  delimiter: z.string().optional(),
  sheets: z.array(sheetPreviewSchema),
  detected: workerLayoutSchema,
  problems: z.array(importProblemSchema),
});

export const importOutcomeSchema = z.strictObject({
  gradebook: gradebookSchema,
  problems: z.array(importProblemSchema),
});

export const detectOutcomeSchema = z.strictObject({
  gradebook: gradebookSchema,
  layout: workerLayoutSchema,
  problems: z.array(importProblemSchema),
});

export const failureSchema = z.strictObject({
  ok: z.literal(false),
  code: z.string().min(1),
  message: z.string().min(1),
  problems: z.array(importProblemSchema).optional(),
});

/** `{ ok: true, value }` with the value checked by `value`, or a well-formed Failure. */
export function resultSchema<T extends z.ZodType>(value: T) {
  return z.discriminatedUnion('ok', [z.strictObject({ ok: z.literal(true), value }), failureSchema]);
}

export interface DetectOutcome {
  readonly gradebook: Gradebook;
  readonly layout: ImportLayout;
  readonly problems: ImportOutcome['problems'];
}

// Compile-time: every checked value is usable as the contract type it stands for (fails tsc if not).
type Check<T extends true> = T;
type Assignable<A, B> = [A] extends [B] ? true : false;
export type ResultSchemaChecks = [
  Check<Assignable<z.output<typeof workbookPreviewSchema>, WorkbookPreview>>,
  Check<Assignable<z.output<typeof importOutcomeSchema>, ImportOutcome>>,
  Check<Assignable<z.output<typeof detectOutcomeSchema>, DetectOutcome>>,
];
