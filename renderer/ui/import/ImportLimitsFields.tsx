/**
 * The import limits the user may raise: the largest file and the longest reading. Every preview,
 * dry run, import and merge of the workspace sends them; a refusal for size or time keeps the
 * service's own message, and these fields sit beside it.
 */
import type { ImportLimitsRequest } from '../../bridge/contract';
import { MAX_IMPORT_LIMITS_REQUEST } from '../../bridge/importLimits';
import { NumberField } from '../common/NumberField';

export type ImportLimitValues = Required<ImportLimitsRequest>;

/** The Failure codes a raised limit can cure (main/services/untrusted). */
export const LIMIT_FAILURE_CODES: readonly string[] = ['too-large', 'timeout'];

export function ImportLimitsFields({ limits, onChange }: { limits: ImportLimitValues; onChange(next: ImportLimitValues): void }) {
  return (
    <fieldset className="wb-import-limits">
      <legend>Limits</legend>
      <NumberField
        label="Largest file (MB)"
        value={limits.maxMegabytes}
        min={0.01}
        max={MAX_IMPORT_LIMITS_REQUEST.maxMegabytes}
        onCommit={(v) => v !== null && onChange({ ...limits, maxMegabytes: v })}
      />
      <NumberField
        label="Time limit (s)"
        value={limits.maxSeconds}
        min={1}
        max={MAX_IMPORT_LIMITS_REQUEST.maxSeconds}
        onCommit={(v) => v !== null && onChange({ ...limits, maxSeconds: v })}
      />
    </fieldset>
  );
}
