/**
 * A file's import must not depend on which file was read before it. Found by the long fuzz suite:
 * a damaged workbook read after an intact one showed the intact one's text. Likely cause: SheetJS
 * inflates into Buffer.allocUnsafe memory of the declared size (xlsx.mjs new_unsafe_buf), so
 * when a damaged stream ends early the rest is whatever that memory held — possibly the previous
 * file. Whether the memory is reused is up to the allocator, so the direct check is repeated. The direct service runs in one long-lived process and is exposed;
 * the one-shot isolated calls start a fresh worker per file.
 */
import { copyFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { previewSpreadsheet } from '../../main/services/spreadsheet';
import { previewSpreadsheetIsolated } from '../../main/services/untrusted';

const dir = mkdtempSync(join(tmpdir(), 'wb-state-'));
const damaged = join(dir, 'damaged-sections.xlsx');
const intact = join(dir, 'glaciology-231-sections.xlsx');
copyFileSync(join(import.meta.dirname, 'fixtures/damaged-sections.xlsx'), damaged);
copyFileSync(join(import.meta.dirname, '../../demo-data/glaciology-231-sections.xlsx'), intact);

describe('an import does not depend on the file read before it', () => {
  it('direct service: the damaged file reads the same alone and after the intact one', async () => {
    const alone = await previewSpreadsheet(damaged);
    // Freed memory is reused at the allocator's whim, so give it several chances.
    for (let i = 0; i < 8; i++) {
      await previewSpreadsheet(intact);
      expect(await previewSpreadsheet(damaged)).toEqual(alone);
    }
  });

  it('one-shot isolated calls: the same', async () => {
    const alone = await previewSpreadsheetIsolated(damaged);
    for (let i = 0; i < 3; i++) {
      await previewSpreadsheetIsolated(intact);
      expect(await previewSpreadsheetIsolated(damaged)).toEqual(alone);
    }
  });
});
