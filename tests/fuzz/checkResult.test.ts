/**
 * The fuzz harness's own verdicts (harness.ts checkResult): a time-limit stop of a legacy .xls is
 * a contained library hang (SheetJS 0.20.3 parse_Rgce, see harness.ts), not a defect; on any other
 * file it is a hang. The long suite once reported such an .xls stop as "unexpected code", because
 * the exemption fell through to the catch-all branch.
 */
import { describe, expect, it } from 'vitest';
import type { Result } from '../../renderer/bridge/contract';
import { checkResult } from './harness';

const timeout: Result<unknown> = {
  ok: false,
  code: 'timeout',
  message: 'Reading "course.xls" took longer than 60 s and was stopped. The file may be damaged or far larger than a gradebook; if it is the right file, raise the time limit in the import limits and try again.',
};
// The OLE2 compound-file signature that opens every legacy .xls (MS-CFB §2.2, the header signature; section from memory).
const xlsBytes = Uint8Array.of(0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0);

describe('fuzz harness verdicts on a time-limit stop', () => {
  it('a legacy .xls stopped at the time limit is no defect', () => {
    expect(checkResult('preview', timeout, { family: 'damaged', fileName: 'course.xls', bytes: xlsBytes })).toEqual([]);
  });

  it('any other file stopped at the time limit is a hang', () => {
    const out = checkResult('preview', timeout, { family: 'damaged', fileName: 'course.xlsx', bytes: Uint8Array.of(0x50, 0x4b, 3, 4) });
    expect(out).toHaveLength(1);
    expect(out[0]).toMatch(/code 'timeout' \(hang\)/);
  });
});
