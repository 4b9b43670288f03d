// Export dialog, end to end: choose columns, order and headers, write CSV and XLSX through the
// real bridge → main/services/export, then read the written files back with the real importer
// (main/services/spreadsheet importSpreadsheet) and compare with the finals the engine computes
// in Node for the same demo course — which the dialog's preview also shows.
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { ColumnLayout, CourseProject, ImportLayout } from '../../renderer/bridge/contract';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import type { StudentResult } from '../../renderer/engine/results';
import { loadDemoCourse } from '../../main/services/demo';
import { importSpreadsheet, previewSpreadsheet } from '../../main/services/spreadsheet';
import { EXPORT_CAUTION } from '../../renderer/ui/export/exportColumns';
import { describeViolations, openApp, runAxe, screenshot, type AppSession } from './harness';

/** Layout for re-import: roles by header; the final-mark column becomes a 100-point assessment. */
async function reimportLayout(path: string, sheetName: string | null, roles: Record<string, ColumnLayout['role']>): Promise<ImportLayout> {
  const preview = await previewSpreadsheet(path);
  if (!preview.ok) throw new Error(preview.message);
  const sheet = preview.value.sheets.find((s) => sheetName === null || s.name === sheetName);
  if (sheet === undefined) throw new Error(`no sheet ${sheetName}`);
  const header = sheet.rows[0] ?? [];
  return {
    ...preview.value.detected,
    sectionFrom: 'column',
    sheets: [{
      sheet: sheet.name,
      headerRow: 0,
      possibleRow: null,
      columns: header.map((h, index) => {
        const role = roles[h] ?? 'ignore';
        return role === 'assessment' ? { index, header: h, role, possible: 100 } : { index, header: h, role };
      }),
    }],
  };
}

async function reimportedFinals(path: string, sheetName: string | null, finalHeader: string): Promise<Map<string, number | null>> {
  const layout = await reimportLayout(path, sheetName, { 'Student ID': 'id', Name: 'name', Section: 'section', [finalHeader]: 'assessment' });
  const imported = await importSpreadsheet(path, layout);
  if (!imported.ok) throw new Error(`${imported.message} ${JSON.stringify(imported.problems ?? [])}`);
  const book = imported.value.gradebook;
  return new Map(book.students.map((s, i) => {
    const cell = book.scores[i]?.[0];
    return [s.id, cell?.kind === 'earned' ? cell.points : null];
  }));
}

async function openExport(page: Page) {
  await page.getByRole('tab', { name: /Sections/ }).click();
  await page.getByRole('toolbar', { name: 'Course commands' }).getByRole('button', { name: 'Export final marks…' }).click();
  const dialog = page.getByRole('dialog', { name: 'Export final marks' });
  await dialog.waitFor();
  return dialog;
}

describe('Export dialog (browser)', () => {
  let app: AppSession;
  let project: CourseProject;
  let results: readonly StudentResult[];
  let dir: string;
  const expectedFinals = () => new Map(project.gradebook.students.map((s, i) => [s.id, results[i]?.final ?? null]));

  beforeAll(async () => {
    const loaded = await loadDemoCourse();
    if (!loaded.ok) throw new Error(loaded.message);
    project = loaded.value;
    results = gradeCourse(project.gradebook, project.plan).students;
    dir = await mkdtemp(join(tmpdir(), 'weighbridge-export-e2e-'));
    app = await openApp({ colorScheme: 'light' });
  });
  afterAll(async () => {
    await app?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('shows the caution and a preview whose rows are the engine’s finals', async () => {
    const dialog = await openExport(app.page);
    expect(await dialog.getByText(EXPORT_CAUTION, { exact: true }).count()).toBe(1);
    const rows = await dialog.locator('.wb-export-preview tbody tr').evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll('td'), (td) => td.textContent ?? '')));
    expect(rows.length).toBe(5);
    rows.forEach((row, i) => {
      const s = project.gradebook.students[i]!;
      const r = results[i]!;
      // Default columns: ID, name, section, final, letter (+ grade points when the scale has them).
      expect(row.slice(0, 5)).toEqual([s.id, s.name, s.section, r.final === null ? '' : String(r.final), r.letter ?? '']);
    });
    const axe = await runAxe(app.page);
    expect(describeViolations(axe)).toEqual([]);
    await screenshot(app.page, 'export-dialog');
  });

  it('writes a CSV with the chosen headers and order whose re-import equals the finals; asks before overwriting', async () => {
    const { page } = app;
    const dialog = page.getByRole('dialog', { name: 'Export final marks' });
    await dialog.getByLabel('Comma-separated text (.csv, UTF-8)').check();
    await dialog.getByLabel('Header for Final %').fill('Final mark');
    await dialog.getByRole('button', { name: 'Move Letter up' }).click(); // letter before final
    const gp = dialog.getByLabel('Include Grade points');
    if (await gp.isChecked()) await gp.uncheck();
    const path = join(dir, 'finals.csv');
    await dialog.getByLabel('Save to').fill(path);
    await dialog.getByRole('button', { name: 'Export', exact: true }).click();
    await dialog.getByText(`Wrote ${project.gradebook.students.length} students to ${path}.`).waitFor();

    const text = await readFile(path, 'utf8');
    expect(text.replace(/^\uFEFF/, '').split(/\r?\n/)[0]).toBe('Student ID,Name,Section,Letter,Final mark');
    expect(await reimportedFinals(path, null, 'Final mark')).toEqual(expectedFinals());

    // Same path again: the service answers 'exists', the dialog asks, and only "Replace" rewrites.
    await dialog.getByRole('button', { name: 'Export', exact: true }).click();
    const confirm = dialog.getByRole('alertdialog', { name: 'Replace the existing file?' });
    await confirm.waitFor();
    await confirm.getByRole('button', { name: 'Replace the file' }).click();
    await dialog.getByText(`Wrote ${project.gradebook.students.length} students to ${path}.`).waitFor();
  });

  it('writes an XLSX with extra sheets whose final-marks sheet re-imports to the same finals', async () => {
    const { page } = app;
    const dialog = page.getByRole('dialog', { name: 'Export final marks' });
    await dialog.getByLabel('Excel workbook (.xlsx)').check();
    await expect.poll(() => dialog.getByLabel('Save to').inputValue()).toBe(join(dir, 'finals.xlsx'));
    await dialog.getByLabel('Section statistics').check();
    await dialog.getByLabel('Assessment statistics').check();
    await dialog.getByRole('button', { name: 'Export', exact: true }).click();
    const path = join(dir, 'finals.xlsx');
    await dialog.getByText(`Wrote ${project.gradebook.students.length} students to ${path}.`).waitFor();
    const preview = await previewSpreadsheet(path);
    if (!preview.ok) throw new Error(preview.message);
    expect(preview.value.sheets.length).toBe(3);
    const finalsSheet = preview.value.sheets[0]!.name;
    expect(await reimportedFinals(path, finalsSheet, 'Final mark')).toEqual(expectedFinals());
    await dialog.getByRole('button', { name: 'Close' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(app.pageErrors).toEqual([]);
  });
});
