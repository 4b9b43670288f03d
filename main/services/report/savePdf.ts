/**
 * Writes a printed report (PDF bytes from the shell's printToPDF) to the path the user chose:
 * absolute, ending in .pdf, written atomically like every other file the app writes.
 */
import { isAbsolute } from 'node:path';
import type { Result } from '../../../renderer/bridge/contract';
import { writeAtomic } from '../project/atomicWrite';

/** A PDF file starts with these bytes (ISO 32000-1, 7.5.2 "File header"). */
const PDF_MAGIC = '%PDF-';

export async function savePdf(path: string, bytes: Uint8Array): Promise<Result<{ path: string }>> {
  if (!isAbsolute(path)) return { ok: false, code: 'bad-input', message: `"${path}" is not a full path; choose where to save the report.` };
  if (!path.toLowerCase().endsWith('.pdf')) {
    return { ok: false, code: 'bad-input', message: `"${path}" does not end in .pdf; the report is saved as a PDF file.` };
  }
  if (new TextDecoder().decode(bytes.subarray(0, PDF_MAGIC.length)) !== PDF_MAGIC) {
    return { ok: false, code: 'internal', message: 'The printed report is not a PDF document; nothing was written.' };
  }
  try {
    await writeAtomic(path, bytes);
    return { ok: true, value: { path } };
  } catch (e) {
    return { ok: false, code: 'io', message: `The report could not be written to "${path}": ${e instanceof Error ? e.message : String(e)}` };
  }
}
