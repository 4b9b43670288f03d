import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { savePdf } from '../../../main/services/report/savePdf';

const dirs: string[] = [];
async function dir(): Promise<string> {
  const d = await mkdtemp(join(tmpdir(), 'wb-pdf-'));
  dirs.push(d);
  return d;
}
afterEach(async () => {
  await Promise.all(dirs.splice(0).map((d) => rm(d, { recursive: true, force: true })));
});

// A PDF file begins with "%PDF-" followed by the version (ISO 32000-1:2008, 7.5.2 "File header").
const pdf = new TextEncoder().encode('%PDF-1.7\n%…\n');

describe('savePdf', () => {
  it('writes the bytes to an absolute .pdf path, replacing an older report', async () => {
    const path = join(await dir(), 'report.pdf');
    await writeFile(path, 'old');
    expect(await savePdf(path, pdf)).toEqual({ ok: true, value: { path } });
    expect(new Uint8Array(await readFile(path))).toEqual(pdf);
  });

  it('refuses relative paths, other extensions and bytes that are not a PDF, writing nothing', async () => {
    const d = await dir();
    expect(await savePdf('report.pdf', pdf)).toMatchObject({ ok: false, code: 'bad-input' });
    const xlsx = join(d, 'marks.xlsx');
    expect(await savePdf(xlsx, pdf)).toMatchObject({ ok: false, code: 'bad-input' });
    const notPdf = join(d, 'r.pdf');
    expect(await savePdf(notPdf, new TextEncoder().encode('<html>'))).toMatchObject({ ok: false });
    await expect(readFile(xlsx)).rejects.toThrow();
    await expect(readFile(notPdf)).rejects.toThrow();
  });
});
