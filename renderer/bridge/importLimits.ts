/**
 * The import limits the window starts with, in its own units. The renderer cannot import main/, so
 * the numbers are written here once and a test (tests/ipc/importLimits.test.ts) keeps them equal to
 * DEFAULT_IMPORT_LIMITS in main/services/untrusted/limits.ts.
 */
import type { ImportLimitsRequest } from './contract';

export const DEFAULT_IMPORT_LIMITS_REQUEST = Object.freeze({ maxMegabytes: 50, maxSeconds: 30 }) satisfies Required<ImportLimitsRequest>;

/** The largest values the bridge accepts (main/services/schemas.ts importLimitsRequestSchema). */
export const MAX_IMPORT_LIMITS_REQUEST = Object.freeze({ maxMegabytes: 2048, maxSeconds: 600 }) satisfies Required<ImportLimitsRequest>;
