/**
 * Runtime schemas (zod 4) for every model and contract type that crosses a boundary: project and
 * plan files on disk, recovery copies, IPC payloads. Each schema is tied to its TypeScript type by
 * a compile-time equality assertion (see `AssertSame` at the bottom), so a field added to
 * `model.ts` or `contract.ts` without a schema change — or the reverse — fails `tsc`.
 *
 * All objects are strict: an unknown key is refused rather than carried along silently, so a file
 * from another program (or a crafted one) cannot smuggle data through a save/load round trip.
 * Records keyed by user data (assessment ids) refuse `__proto__`, `constructor` and `prototype`
 * keys so a parsed file can never reach `Object.prototype`.
 */
import { z } from 'zod';
import type {
  Adjustment,
  Assessment,
  Category,
  GradeCutoff,
  GradeScale,
  Gradebook,
  GradingPlan,
  ItemRule,
  MarkMode,
  RoundingRule,
  Score,
  SectionWaiver,
  Student,
  StudentWaiver,
} from '../../renderer/engine/model';
import type {
  CellLocation,
  ColumnLayout,
  ColumnRole,
  CourseProject,
  ExportColumn,
  ExportFormat,
  ExportRequest,
  FileKind,
  ImportLayout,
  ImportLimitsRequest,
  ImportProblem,
  RecoveryInfo,
  ScoreTokens,
  SheetLayout,
  SourceInfo,
  TextEncoding,
} from '../../renderer/bridge/contract';
import { MAX_IMPORT_LIMITS_REQUEST } from '../../renderer/bridge/importLimits';

const finite = z.number().finite();
const nonEmpty = z.string().min(1);
/** Keys that would reach or shadow Object.prototype if a record were built naively. */
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);
const safeKey = nonEmpty.refine((k) => !FORBIDDEN_KEYS.has(k), {
  message: 'This name is reserved and cannot be used as an id; rename the assessment.',
});

// ---------------------------------------------------------------------------------------------
// Gradebook
// ---------------------------------------------------------------------------------------------

export const scoreSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('earned'), points: finite }),
  z.strictObject({ kind: z.literal('missing') }),
  z.strictObject({ kind: z.literal('excused') }),
  z.strictObject({ kind: z.literal('pending') }),
]);

/**
 * True only for a value scoreSchema certainly accepts: a plain object whose own keys are exactly
 * `kind` (missing / excused / pending) or `kind` and a finite `points` (earned). It may refuse
 * something zod would accept (an object with another prototype, say); the grid is then parsed by
 * zod, which decides. Property-tested never to accept what scoreSchema refuses.
 */
export function isPlainScore(x: unknown): boolean {
  if (typeof x !== 'object' || x === null) return false;
  const proto: unknown = Object.getPrototypeOf(x);
  if (proto !== Object.prototype && proto !== null) return false;
  const keys = Object.keys(x);
  const cell = x as { kind?: unknown; points?: unknown };
  if (cell.kind === 'earned') {
    return keys.length === 2 && Object.hasOwn(x, 'kind') && Object.hasOwn(x, 'points') && typeof cell.points === 'number' && Number.isFinite(cell.points);
  }
  return keys.length === 1 && Object.hasOwn(x, 'kind') && (cell.kind === 'missing' || cell.kind === 'excused' || cell.kind === 'pending');
}

const zodScoreGrid = z.array(z.array(scoreSchema));

/**
 * The score grid (one row per student): every cell checked by isPlainScore — a course holds up to a
 * million cells and zod's per-cell parse costs about ten times as much — and, when any cell is not
 * plainly valid, the whole grid parsed by zod for its exact issues (paths and messages).
 */
const scoreGridSchema = z.unknown().transform((grid, ctx): Score[][] => {
  if (Array.isArray(grid) && grid.every((row) => Array.isArray(row) && row.every(isPlainScore))) return grid as Score[][];
  const parsed = zodScoreGrid.safeParse(grid);
  if (parsed.success) return parsed.data;
  for (const issue of parsed.error.issues) ctx.addIssue({ ...issue, code: 'custom' });
  return z.NEVER;
});

export const studentSchema = z.strictObject({
  id: nonEmpty,
  name: z.string(),
  section: z.string(),
  email: z.string().optional(),
});

export const assessmentSchema = z.strictObject({
  id: safeKey,
  name: z.string(),
  possible: finite.positive(),
});

function duplicates(ids: readonly string[]): string[] {
  const seen = new Set<string>();
  const dup = new Set<string>();
  for (const id of ids) {
    if (seen.has(id)) dup.add(id);
    seen.add(id);
  }
  return [...dup];
}

/** Grid shape: one row per student, one cell per assessment; ids unique. */
export const gradebookSchema = z
  .strictObject({
    students: z.array(studentSchema),
    assessments: z.array(assessmentSchema),
    scores: scoreGridSchema,
  })
  .superRefine((book, ctx) => {
    const a = book.assessments.length;
    if (book.scores.length !== book.students.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['scores'],
        message: `The score grid has ${book.scores.length} rows but there are ${book.students.length} students; each student needs exactly one row.`,
      });
    }
    book.scores.forEach((row, i) => {
      if (row.length !== a) {
        ctx.addIssue({
          code: 'custom',
          path: ['scores', i],
          message: `Score row ${i} has ${row.length} cells but there are ${a} assessments; each row needs one cell per assessment.`,
        });
      }
    });
    for (const id of duplicates(book.students.map((s) => s.id))) {
      ctx.addIssue({ code: 'custom', path: ['students'], message: `Student ID "${id}" appears more than once; IDs must be unique.` });
    }
    for (const id of duplicates(book.assessments.map((s) => s.id))) {
      ctx.addIssue({ code: 'custom', path: ['assessments'], message: `Assessment id "${id}" appears more than once; ids must be unique.` });
    }
  });

// ---------------------------------------------------------------------------------------------
// Grading plan
// ---------------------------------------------------------------------------------------------

export const combineRuleSchema = z.enum(['totalPoints', 'equalItems']);

export const categorySchema = z.strictObject({
  id: nonEmpty,
  name: z.string(),
  weight: finite.nonnegative(),
  combine: combineRuleSchema,
  dropLowest: z.number().int().nonnegative(),
  missingAs: z.enum(['zero', 'excluded']),
  capPercent: finite.positive().nullable(),
  droppedForCourse: z.boolean(),
});

export const itemRuleSchema = z.strictObject({
  categoryId: nonEmpty.nullable(),
  extraCredit: z.boolean(),
});

export const sectionWaiverSchema = z.strictObject({
  section: z.string(),
  categoryId: nonEmpty,
  note: z.string().optional(),
});

export const studentWaiverSchema = z.strictObject({
  studentId: nonEmpty,
  categoryId: nonEmpty,
  note: z.string().optional(),
});

export const gradeCutoffSchema = z.strictObject({
  letter: nonEmpty,
  minPercent: finite,
  gradePoints: finite.optional(),
  passing: z.boolean().optional(),
});

export const gradeScaleSchema = z
  .strictObject({
    name: z.string(),
    cutoffs: z.array(gradeCutoffSchema).min(1),
  })
  .superRefine((scale, ctx) => {
    for (const letter of duplicates(scale.cutoffs.map((c) => c.letter))) {
      ctx.addIssue({ code: 'custom', path: ['cutoffs'], message: `Letter "${letter}" appears more than once in the grade scale.` });
    }
  });

/** Decimals 0–6, the range the engine rounds exactly (renderer/engine/grading/checkPlan.ts). */
export const roundingRuleSchema = z.strictObject({
  decimals: z.number().int().min(0).max(6),
});

export const adjustmentSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('addPoints'), section: z.string().nullable(), points: finite }),
  z.strictObject({ kind: z.literal('scaleToMean'), section: z.string().nullable(), targetMean: finite.nonnegative() }),
  z.strictObject({ kind: z.literal('cap'), section: z.string().nullable(), maxPercent: finite }),
]);

export const markModeSchema = z.enum(['current', 'projected']);

export const gradingPlanSchema = z
  .strictObject({
    categories: z.array(categorySchema),
    items: z.record(safeKey, itemRuleSchema),
    sectionWaivers: z.array(sectionWaiverSchema),
    studentWaivers: z.array(studentWaiverSchema),
    markMode: markModeSchema,
    scale: gradeScaleSchema,
    rounding: roundingRuleSchema,
    adjustments: z.array(adjustmentSchema),
  })
  .superRefine((plan, ctx) => {
    for (const id of duplicates(plan.categories.map((c) => c.id))) {
      ctx.addIssue({ code: 'custom', path: ['categories'], message: `Category id "${id}" appears more than once; ids must be unique.` });
    }
  });

// ---------------------------------------------------------------------------------------------
// Import layout and problems (contract)
// ---------------------------------------------------------------------------------------------

export const cellLocationSchema = z.strictObject({
  sheet: z.string(),
  row: z.number().int().positive().optional(),
  column: z.string().regex(/^[A-Z]+$/).optional(),
  header: z.string().optional(),
  value: z.string().optional(),
});

export const importProblemSchema = z.strictObject({
  severity: z.enum(['error', 'warning']),
  code: nonEmpty,
  message: z.string(),
  at: cellLocationSchema.optional(),
});

export const scoreTokensSchema = z.strictObject({
  excused: z.array(z.string()),
  missing: z.array(z.string()),
  pending: z.array(z.string()),
});

export const columnRoleSchema = z.enum(['id', 'name', 'firstName', 'lastName', 'section', 'email', 'assessment', 'ignore']);

export const columnLayoutSchema = z.strictObject({
  index: z.number().int().nonnegative(),
  header: z.string(),
  role: columnRoleSchema,
  possible: finite.positive().optional(),
});

export const sheetLayoutSchema = z.strictObject({
  sheet: z.string(),
  headerRow: z.number().int().nonnegative(),
  possibleRow: z.number().int().nonnegative().nullable(),
  columns: z.array(columnLayoutSchema),
});

export const textEncodingSchema = z.enum(['utf-8', 'utf-16le', 'utf-16be', 'windows-1252']);

export const importLayoutSchema = z.strictObject({
  sheets: z.array(sheetLayoutSchema),
  sectionFrom: z.enum(['column', 'sheetName']),
  tokens: scoreTokensSchema,
  encoding: textEncodingSchema.optional(),
  delimiter: z.string().min(1).max(1).optional(),
});

/**
 * Import limits from the window: positive, and no larger than MAX_IMPORT_LIMITS_REQUEST (2 GB is
 * beyond any gradebook; ten minutes beyond any patience). zod 4 numbers refuse NaN and ±Infinity.
 */
export const importLimitsRequestSchema = z.strictObject({
  maxMegabytes: z.number().positive().max(MAX_IMPORT_LIMITS_REQUEST.maxMegabytes).optional(),
  maxSeconds: z.number().positive().max(MAX_IMPORT_LIMITS_REQUEST.maxSeconds).optional(),
});

/** The optional override passed to previewSpreadsheet. */
export const previewOverrideSchema = z.strictObject({
  encoding: textEncodingSchema.optional(),
  delimiter: z.string().min(1).max(1).optional(),
  limits: importLimitsRequestSchema.optional(),
});

export const sourceInfoSchema = z.strictObject({
  path: nonEmpty,
  fileName: z.string(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  importedAt: z.string(),
  layout: importLayoutSchema,
});

// ---------------------------------------------------------------------------------------------
// Project, recovery, export (contract)
// ---------------------------------------------------------------------------------------------

export const courseProjectSchema = z.strictObject({
  title: z.string(),
  gradebook: gradebookSchema,
  plan: gradingPlanSchema,
  source: sourceInfoSchema.nullable(),
  notes: z.string(),
});

export const isoTimestampSchema = z.iso.datetime({ offset: true });

export const recoveryInfoSchema = z.strictObject({
  savedAt: isoTimestampSchema,
  projectPath: nonEmpty.nullable(),
  project: courseProjectSchema,
});

export const exportFormatSchema = z.enum(['xlsx', 'csv']);

export const exportColumnSchema = z.strictObject({
  field: z.enum(['id', 'name', 'section', 'email', 'final', 'letter', 'gradePoints']),
  header: z.string(),
});

export const exportRequestSchema = z.strictObject({
  path: nonEmpty,
  format: exportFormatSchema,
  project: courseProjectSchema,
  columns: z.array(exportColumnSchema).min(1),
  include: z.strictObject({
    breakdown: z.boolean(),
    sectionStatistics: z.boolean(),
    assessmentStatistics: z.boolean(),
  }),
  overwrite: z.boolean(),
  projectPath: nonEmpty.nullable().optional(),
});

export const fileKindSchema = z.enum(['spreadsheet', 'project', 'export', 'report']);

/** A file-system path argument of an IPC call. */
export const pathSchema = nonEmpty.max(4096);

// ---------------------------------------------------------------------------------------------
// Issue formatting
// ---------------------------------------------------------------------------------------------

/** `project.gradebook.scores[3][2].points` — the zod path as a reader would write it. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out === '' ? '(top level)' : out;
}

/** The first `max` issues of a zod error, each "path: message", joined for a user message. */
export function describeIssues(error: z.ZodError, prefix: readonly PropertyKey[] = [], max = 5): string {
  const lines = error.issues.slice(0, max).map((issue) => `${formatPath([...prefix, ...issue.path])}: ${issue.message}`);
  const more = error.issues.length > max ? ` (and ${error.issues.length - max} more)` : '';
  return lines.join('; ') + more;
}

// ---------------------------------------------------------------------------------------------
// Compile-time ties between schemas and types: each line fails `tsc` if they drift apart.
// ---------------------------------------------------------------------------------------------

type DeepReadonly<T> = T extends (infer U)[]
  ? readonly DeepReadonly<U>[]
  : T extends readonly (infer U)[]
    ? readonly DeepReadonly<U>[]
    : T extends object
      ? { readonly [K in keyof T]: DeepReadonly<T[K]> }
      : T;
type Equals<X, Y> = (<T>() => T extends X ? 1 : 2) extends (<T>() => T extends Y ? 1 : 2) ? true : false;
type AssertSame<S extends z.ZodType, T> = Equals<DeepReadonly<z.output<S>>, DeepReadonly<T>>;
type Check<T extends true> = T;

export type SchemaTypeChecks = [
  Check<AssertSame<typeof scoreSchema, Score>>,
  Check<AssertSame<typeof studentSchema, Student>>,
  Check<AssertSame<typeof assessmentSchema, Assessment>>,
  Check<AssertSame<typeof gradebookSchema, Gradebook>>,
  Check<AssertSame<typeof categorySchema, Category>>,
  Check<AssertSame<typeof itemRuleSchema, ItemRule>>,
  Check<AssertSame<typeof sectionWaiverSchema, SectionWaiver>>,
  Check<AssertSame<typeof studentWaiverSchema, StudentWaiver>>,
  Check<AssertSame<typeof gradeCutoffSchema, GradeCutoff>>,
  Check<AssertSame<typeof gradeScaleSchema, GradeScale>>,
  Check<AssertSame<typeof roundingRuleSchema, RoundingRule>>,
  Check<AssertSame<typeof adjustmentSchema, Adjustment>>,
  Check<AssertSame<typeof markModeSchema, MarkMode>>,
  Check<AssertSame<typeof gradingPlanSchema, GradingPlan>>,
  Check<AssertSame<typeof cellLocationSchema, CellLocation>>,
  Check<AssertSame<typeof importProblemSchema, ImportProblem>>,
  Check<AssertSame<typeof scoreTokensSchema, ScoreTokens>>,
  Check<AssertSame<typeof columnRoleSchema, ColumnRole>>,
  Check<AssertSame<typeof columnLayoutSchema, ColumnLayout>>,
  Check<AssertSame<typeof sheetLayoutSchema, SheetLayout>>,
  Check<AssertSame<typeof textEncodingSchema, TextEncoding>>,
  Check<AssertSame<typeof importLayoutSchema, ImportLayout>>,
  Check<AssertSame<typeof importLimitsRequestSchema, ImportLimitsRequest>>,
  Check<AssertSame<typeof sourceInfoSchema, SourceInfo>>,
  Check<AssertSame<typeof courseProjectSchema, CourseProject>>,
  Check<AssertSame<typeof recoveryInfoSchema, RecoveryInfo>>,
  Check<AssertSame<typeof exportFormatSchema, ExportFormat>>,
  Check<AssertSame<typeof exportColumnSchema, ExportColumn>>,
  Check<AssertSame<typeof exportRequestSchema, ExportRequest>>,
  Check<AssertSame<typeof fileKindSchema, FileKind>>,
];
