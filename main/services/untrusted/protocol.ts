/**
 * Messages between the main thread and the parsing worker. The worker's replies carry data
 * derived from an untrusted file, so the main thread checks their envelope here and their
 * payload with the schemas in resultSchemas.ts before anything else sees them.
 */
import { z } from 'zod';
import type { ImportLayout, TextEncoding } from '../../../renderer/bridge/contract';

export type JobKind = 'preview' | 'import' | 'detect';

export interface TestOnlyHooks {
  /**
   * TESTS ONLY: the worker spins synchronously this long before parsing, so a test can show the
   * time limit stops a parse that never yields. Never set outside tests.
   */
  readonly testOnlyBusyMillis?: number;
}

export interface JobRequest {
  readonly type: 'job';
  readonly id: number;
  readonly kind: JobKind;
  readonly bytes: Uint8Array;
  readonly fileName: string;
  readonly override?: { readonly encoding?: TextEncoding; readonly delimiter?: string };
  readonly layout?: ImportLayout;
  /**
   * The worker's heap limit in bytes: the reply may not be larger once posted (replySize.ts),
   * nor may a ZIP declare more uncompressed data (zipCheck.ts).
   */
  readonly maxReplyBytes: number;
  readonly testOnly?: TestOnlyHooks;
}

/** Sent once when the worker has loaded its modules; job timers start after it. */
export const readyMessageSchema = z.strictObject({ type: z.literal('ready') });

export const jobReplySchema = z.discriminatedUnion('outcome', [
  z.strictObject({
    type: z.literal('reply'),
    id: z.number().int(),
    outcome: z.literal('done'),
    /** The service's Result, unchecked until resultSchemas has parsed it. */
    result: z.unknown(),
    /** Keys added to or replaced on built-in prototypes in the worker during this job. */
    pollution: z.array(z.string()),
  }),
  z.strictObject({
    type: z.literal('reply'),
    id: z.number().int(),
    outcome: z.literal('oversized'),
    /** Which guard: the ZIP's declared uncompressed size, or the size of the reply. */
    reason: z.enum(['declared', 'reply']),
    /** The size that went over the budget (a reply estimate stops counting soon after). */
    bytes: z.number(),
    pollution: z.array(z.string()),
  }),
  z.strictObject({
    type: z.literal('reply'),
    id: z.number().int(),
    outcome: z.literal('threw'),
    /** The exception's text: a defect of the importer, never expected. */
    error: z.string(),
    pollution: z.array(z.string()),
  }),
]);

export type JobReply = z.infer<typeof jobReplySchema>;
