/**
 * The argument list each bridge method accepts, as a zod tuple. Everything that arrives over IPC
 * (or over the browser harness's loopback connection) is checked against these before any service
 * sees it: the renderer is treated as untrusted input, like a file.
 */
import { isAbsolute } from 'node:path';
import { z } from 'zod';
import type { DesktopBridge } from '../../renderer/bridge/contract';
import {
  courseProjectSchema,
  exportRequestSchema,
  fileKindSchema,
  importLayoutSchema,
  importLimitsRequestSchema,
  pathSchema,
  previewOverrideSchema,
} from '../services/schemas';
import type { BridgeMethod } from './channels';

/**
 * A path from the renderer must be absolute: a relative one would be resolved against the main
 * process's working directory, which the user never chose. NUL bytes are refused because Node's
 * fs refuses them too, with a less helpful message.
 */
export const absolutePathSchema = pathSchema
  .refine((p) => !p.includes('\0'), { message: 'A file path cannot contain a NUL character.' })
  .refine((p) => isAbsolute(p), { message: 'Give the full (absolute) path of the file, e.g. /home/me/marks.xlsx or C:\\Users\\me\\marks.xlsx.' });

/** A file name offered in a save dialog: not a path, just the name. */
const suggestedNameSchema = z.string().max(255);

/** The project path a recovery copy belongs to; null for a course never saved. */
const projectPathOrNull = absolutePathSchema.nullable();
/** The longest course JSON the recovery copy accepts (about V8's longest string, 2²⁹ − 24 characters). */
export const MAX_PROJECT_JSON_CHARS = 500_000_000;

const noArgs = z.tuple([]);

/** Each schema's output must be assignable to the method's parameters, so the table cannot drift from the contract. */
type ArgSchemaTable = { readonly [M in BridgeMethod]: z.ZodType<Parameters<DesktopBridge[M]>> };

export const argSchemas: ArgSchemaTable = {
  chooseOpenPath: z.tuple([fileKindSchema]),
  chooseSavePath: z.tuple([fileKindSchema, suggestedNameSchema]),
  previewSpreadsheet: z.tuple([absolutePathSchema, previewOverrideSchema.optional()]),
  importSpreadsheet: z.tuple([absolutePathSchema, importLayoutSchema, importLimitsRequestSchema.optional()]),
  previewMerge: z.tuple([courseProjectSchema, absolutePathSchema, importLayoutSchema, importLimitsRequestSchema.optional()]),
  loadProject: z.tuple([absolutePathSchema]),
  saveProject: z.tuple([absolutePathSchema, courseProjectSchema]),
  exportFinals: z.tuple([
    exportRequestSchema
      .refine((r) => isAbsolute(r.path), { message: 'Give the full (absolute) path to export to.', path: ['path'] })
      // The open project's path is compared with the target by file identity: a relative one would
      // be resolved against the main process's working directory and could miss.
      .refine((r) => r.projectPath === undefined || r.projectPath === null || isAbsolute(r.projectPath), {
        message: 'The open project path must be a full (absolute) path.',
        path: ['projectPath'],
      }),
  ]),
  // The JSON text is parsed and checked against courseProjectSchema by the recovery store.
  writeRecovery: z.tuple([projectPathOrNull, z.string().min(2).max(MAX_PROJECT_JSON_CHARS)]),
  readRecovery: noArgs,
  discardRecovery: noArgs,
  recentFiles: noArgs,
  demoCourse: noArgs,
};

/** Parameter names, so that a refusal reads "layout.sheets[0].headerRow", not "[1].sheets[0]…". */
export const argNames: { readonly [M in BridgeMethod]: readonly string[] } = {
  chooseOpenPath: ['kind'],
  chooseSavePath: ['kind', 'suggestedName'],
  previewSpreadsheet: ['path', 'override'],
  importSpreadsheet: ['path', 'layout', 'limits'],
  previewMerge: ['current', 'path', 'layout', 'limits'],
  loadProject: ['path'],
  saveProject: ['path', 'project'],
  exportFinals: ['request'],
  writeRecovery: ['projectPath', 'projectJson'],
  readRecovery: [],
  discardRecovery: [],
  recentFiles: [],
  demoCourse: [],
};

/** Internal shell channel `wb:setDirty`: `[dirty]`. */
export const setDirtyArgsSchema = z.tuple([z.boolean()]);

/** `wb:printReportToPdf`: the report page (bounded, so a runaway page cannot exhaust memory) and an absolute target path. */
export const MAX_REPORT_HTML_CHARS = 50_000_000;
export const printReportArgsSchema = z.tuple([z.string().min(1).max(MAX_REPORT_HTML_CHARS), absolutePathSchema]);
