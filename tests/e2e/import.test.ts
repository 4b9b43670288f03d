// The Import workspace in real Chromium against the real spreadsheet services, on the demo
// spreadsheet (demo-data/glaciology-231.xlsx, invented data). Every expected value is computed
// here by calling the same services directly (previewSpreadsheet, importSpreadsheet,
// previewMerge) and the engine's suggestPlan, so the test checks that the UI shows and loads
// exactly what the services produce for the layout the user set — not numbers typed in by hand.
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import type { ImportLayout, ImportProblem, WorkbookPreview } from '../../renderer/bridge/contract';
import { importSpreadsheet, previewMerge, previewSpreadsheet } from '../../main/services/spreadsheet';
import { createBridgeHandlers, dispatchBridgeCall } from '../../main/ipc/index';
import { loadDemoCourse } from '../../main/services/demo';
import { loadProject } from '../../main/services/project';
import { DEFAULT_IMPORT_LIMITS_REQUEST } from '../../renderer/bridge/importLimits';
import { suggestPlan } from '../../renderer/engine/grading/suggestPlan';
import { columnLetter } from '../../renderer/ui/common/columnLetter';
import { assessmentColumns, setColumnRole } from '../../renderer/ui/import/layoutEdits';
import { answerPathDialog, describeViolations, openApp, repoRoot, runAxe, screenshot, type AppSession } from './harness';

const xlsx = join(repoRoot, 'demo-data', 'glaciology-231.xlsx');
const csv = join(repoRoot, 'demo-data', 'glaciology-231.csv');

const sessions: AppSession[] = [];
const temps: string[] = [];
afterEach(async () => {
  await Promise.all(sessions.splice(0).map((s) => s.close()));
  await Promise.all(temps.splice(0).map((d) => rm(d, { recursive: true, force: true })));
});

async function start(opts?: Parameters<typeof openApp>[0]): Promise<AppSession> {
  const s = await openApp(opts);
  sessions.push(s);
  return s;
}

let preview: WorkbookPreview;
let detected: ImportLayout;

beforeAll(async () => {
  const r = await previewSpreadsheet(xlsx);
  if (!r.ok) throw new Error(`The demo spreadsheet does not preview: ${r.message}`);
  preview = r.value;
  detected = r.value.detected;
});

/** The problems the services report for `layout` (what the UI's problem list must show). */
async function problemsFor(path: string, layout: ImportLayout): Promise<readonly ImportProblem[]> {
  const r = await importSpreadsheet(path, layout);
  return r.ok ? r.value.problems : (r.problems ?? []);
}

function countsText(problems: readonly ImportProblem[]): string {
  const errors = problems.filter((p) => p.severity === 'error').length;
  const warnings = problems.length - errors;
  if (problems.length === 0) return 'none';
  return `${errors} ${errors === 1 ? 'error' : 'errors'}, ${warnings} ${warnings === 1 ? 'warning' : 'warnings'}`;
}

const courseTitle = (page: Page) => page.getByRole('banner').getByRole('heading', { level: 1 }).textContent();
const problemCounts = (page: Page) => page.locator('.wb-problem-counts').textContent();
const assessmentsHeading = (page: Page) => page.getByRole('heading', { name: /^Assessments to import/ }).textContent();
const roleSelect = (page: Page, index: number, header: string) => page.getByLabel(`Role of column ${columnLetter(index)} (${header})`, { exact: true });

async function openImport(page: Page, path: string): Promise<void> {
  await page.getByRole('tab', { name: 'Import' }).click();
  await page.getByRole('button', { name: /^Choose (a spreadsheet|another file)…$/ }).click();
  await answerPathDialog(page, path);
  await page.getByRole('region', { name: /^Preview of sheet / }).waitFor();
}

const sheetName = () => detected.sheets[0]!.sheet;
const columnByHeader = (header: string) => {
  const c = detected.sheets[0]!.columns.find((col) => col.header === header);
  if (c === undefined) throw new Error(`The demo spreadsheet has no column "${header}"`);
  return c;
};

describe('Import workspace', { timeout: 90_000 }, () => {
  it('shows the detected layout: header and points-possible rows, one role per column, the located problems', async () => {
    const { page } = await start();
    await openImport(page, xlsx);
    const sheet = detected.sheets[0]!;
    expect(await page.getByLabel('Header row').inputValue()).toBe(String(sheet.headerRow));
    expect(await page.getByLabel('Points-possible row').inputValue()).toBe(String(sheet.possibleRow));
    // The row headers say which row is which, in words.
    const headerRowCell = page.locator('tbody tr').nth(sheet.headerRow).locator('th');
    expect(await headerRowCell.textContent()).toBe(`${sheet.headerRow + 1}Header`);
    for (const col of sheet.columns) expect(await roleSelect(page, col.index, col.header).inputValue()).toBe(col.role);
    expect(await assessmentsHeading(page)).toBe(`Assessments to import (${assessmentColumns(detected).length})`);
    const expected = await problemsFor(xlsx, detected);
    await expect.poll(() => problemCounts(page)).toBe(countsText(expected));
    // Each problem row names the place as the services located it.
    const rows = page.getByRole('region', { name: 'Problem list' }).locator('tbody tr');
    expect(await rows.count()).toBe(expected.length);
    for (const [i, p] of expected.entries()) {
      const cells = await rows.nth(i).locator('td').allTextContents();
      expect(cells[1]).toBe(p.at?.sheet ?? '');
      expect(cells[2]).toBe(String(p.at?.row ?? ''));
      expect(cells[4]).toBe(p.at?.value ?? '');
      expect(cells[5]).toBe(p.message);
    }
  });

  it('marking a column Ignore takes it off the assessment list and its problems off the problem list', async () => {
    const { page } = await start();
    await openImport(page, xlsx);
    // The bonus column is the one with located warnings (scores above its points possible).
    const before = await problemsFor(xlsx, detected);
    const warned = before.find((p) => p.at?.header !== undefined);
    expect(warned).toBeDefined();
    const col = columnByHeader(warned!.at!.header!);
    const corrected = setColumnRole(detected, sheetName(), col.index, 'ignore');
    const after = await problemsFor(xlsx, corrected);
    expect(after.length).toBeLessThan(before.length);

    await roleSelect(page, col.index, col.header).selectOption('ignore');
    await expect.poll(() => assessmentsHeading(page)).toBe(`Assessments to import (${assessmentColumns(corrected).length})`);
    expect(await page.getByRole('list', { name: /^Assessments to import/ }).textContent()).not.toContain(col.header);
    await expect.poll(() => problemCounts(page)).toBe(countsText(after));
    // And back: choosing Assessment again restores both lists.
    await roleSelect(page, col.index, col.header).selectOption('assessment');
    await expect.poll(() => problemCounts(page)).toBe(countsText(before));
  });

  it('an error in the layout blocks loading and says where', async () => {
    const { page } = await start();
    await openImport(page, xlsx);
    const id = detected.sheets[0]!.columns.find((c) => c.role === 'id')!;
    const broken = setColumnRole(detected, sheetName(), id.index, 'ignore');
    const expected = await problemsFor(xlsx, broken);
    const firstError = expected.find((p) => p.severity === 'error');
    expect(firstError).toBeDefined();
    await roleSelect(page, id.index, id.header).selectOption('ignore');
    await expect.poll(() => problemCounts(page)).toBe(countsText(expected));
    expect(await page.getByRole('button', { name: 'Load into course' }).isDisabled()).toBe(true);
    expect(await page.getByRole('region', { name: 'Problem list' }).textContent()).toContain(firstError!.message);
  });

  it('loads the corrected layout as a new course in one undoable step, saves it and re-opens it', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'weighbridge-import-test-'));
    temps.push(dir);
    const { page } = await start();
    const demoTitle = await courseTitle(page);
    await openImport(page, xlsx);
    const bonus = columnByHeader(detected.sheets[0]!.columns.filter((c) => c.role === 'assessment').at(-1)!.header);
    await roleSelect(page, bonus.index, bonus.header).selectOption('ignore');
    const corrected = setColumnRole(detected, sheetName(), bonus.index, 'ignore');
    const imported = await importSpreadsheet(xlsx, corrected);
    if (!imported.ok) throw new Error(imported.message);
    const book = imported.value.gradebook;

    const load = page.getByRole('button', { name: 'Load into course' });
    await expect.poll(() => load.isEnabled()).toBe(true);
    await load.click();
    // The title is the file's title line (the first text above the header row).
    const fileTitle = preview.sheets[0]!.rows.slice(0, corrected.sheets[0]!.headerRow).flat().find((c) => c.trim() !== '')!.trim();
    await expect.poll(() => courseTitle(page)).toBe(fileTitle);
    expect(await page.getByRole('banner').textContent()).toContain(`${book.students.length} students`);
    expect(await page.getByRole('banner').textContent()).toContain('Unsaved course');

    // Undo and redo, by keyboard and by button: the whole import is one step.
    await page.locator('body').press('Control+z');
    await expect.poll(() => courseTitle(page)).toBe(demoTitle);
    await page.getByRole('button', { name: /^Redo Import glaciology-231\.xlsx$/ }).click();
    await expect.poll(() => courseTitle(page)).toBe(fileTitle);
    await page.getByRole('button', { name: /^Undo Import glaciology-231\.xlsx$/ }).click();
    await expect.poll(() => courseTitle(page)).toBe(demoTitle);
    await page.locator('body').press('Control+Shift+z');
    await expect.poll(() => courseTitle(page)).toBe(fileTitle);
    await page.locator('body').press('Control+z');
    await page.locator('body').press('Control+y');
    await expect.poll(() => courseTitle(page)).toBe(fileTitle);

    const file = join(dir, 'geo231.weighbridge');
    await page.locator('body').press('Control+s');
    await answerPathDialog(page, file);
    await expect.poll(() => page.getByRole('banner').textContent()).toContain('All changes saved');
    // The saved course is exactly the services' import of the corrected layout, with the engine's suggested plan.
    const saved = await loadProject(file);
    if (!saved.ok) throw new Error(saved.message);
    expect(saved.value.gradebook).toEqual(book);
    expect(saved.value.plan).toEqual(suggestPlan(book));
    expect(saved.value.source?.layout).toEqual(corrected);
    expect(saved.value.source?.sha256).toBe(preview.sha256);
    expect(saved.value.gradebook.assessments.map((a) => a.id)).not.toContain(bonus.header);

    const again = await start();
    await again.page.getByRole('button', { name: 'Open…' }).click();
    await answerPathDialog(again.page, file);
    await expect.poll(() => courseTitle(again.page)).toBe(fileTitle);
    expect(await again.page.getByRole('banner').textContent()).toContain(`${book.students.length} students`);
  });

  it('merges a newer export after showing what it changes', async () => {
    const { page } = await start();
    const demo = await loadDemoCourse(repoRoot);
    if (!demo.ok) throw new Error(demo.message);
    const expected = await previewMerge(demo.value, xlsx, detected);
    if (!expected.ok) throw new Error(expected.message);
    await openImport(page, xlsx);
    const merge = page.getByRole('button', { name: 'Merge as newer export' });
    await expect.poll(() => merge.isEnabled()).toBe(true);
    await merge.click();
    const dialog = page.getByRole('dialog', { name: 'Merge glaciology-231.xlsx into the open course?' });
    await dialog.waitFor();
    const headings = await dialog.getByRole('heading', { level: 3 }).allTextContents();
    expect(headings).toEqual([
      `Students added (${expected.value.addedStudents.length})`,
      `Students not in the new file (kept, not deleted) (${expected.value.missingStudents.length})`,
      `New assessments (${expected.value.addedAssessments.length})`,
      `Changed scores (${expected.value.changedScores.length})`,
    ].filter(() => expected.value.addedStudents.length + expected.value.missingStudents.length + expected.value.addedAssessments.length + expected.value.changedScores.length > 0));
    const results = await runAxe(page);
    expect(describeViolations(results)).toEqual([]);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(await page.getByRole('button', { name: 'Undo' }).isDisabled()).toBe(true);
  });

  it('Cancel during a long read discards the result', async () => {
    const { page } = await start();
    // Hold the preview call at the network layer until Cancel has been pressed: no timing involved.
    let release: () => void = () => undefined;
    const held = new Promise<void>((resolve) => (release = resolve));
    await page.route('**/rpc/previewSpreadsheet', async (route) => {
      await held;
      await route.continue();
    });
    await page.getByRole('tab', { name: 'Import' }).click();
    await page.getByRole('button', { name: 'Choose a spreadsheet…' }).click();
    await answerPathDialog(page, xlsx);
    const busy = page.getByRole('status').filter({ has: page.getByRole('progressbar') });
    await busy.waitFor();
    await busy.getByRole('button', { name: 'Cancel' }).click();
    await busy.waitFor({ state: 'detached' });
    const answered = page.waitForResponse('**/rpc/previewSpreadsheet');
    release();
    expect((await answered).status()).toBe(200);
    // The reply arrived and was dropped: a later render still shows no preview.
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    expect(await page.getByRole('region', { name: /^Preview of sheet / }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Choose a spreadsheet…' }).isEnabled()).toBe(true);
  });

  it('re-reads a text file with another delimiter when asked', async () => {
    const { page } = await start();
    await openImport(page, csv);
    const direct = await previewSpreadsheet(csv);
    if (!direct.ok) throw new Error(direct.message);
    expect(await page.getByLabel('Delimiter').inputValue()).toBe(direct.value.delimiter);
    const semicolon = await previewSpreadsheet(csv, { delimiter: ';' });
    if (!semicolon.ok) throw new Error(semicolon.message);
    await page.getByLabel('Delimiter').selectOption(';');
    await expect.poll(() => page.getByLabel('Delimiter').inputValue()).toBe(';');
    // One field per line now: the grid is as wide as the services' preview says.
    const width = Math.max(semicolon.value.sheets[0]!.totalColumns, 1);
    await expect.poll(() => page.locator('.wb-preview thead th').count()).toBe(width + 1);
  });

  it('a file over the size limit is refused in the service\'s words; raising the limit reads it', async () => {
    const { page } = await start();
    // The refusal the same request gets from the bridge's direct reading (what the harness runs).
    const dir = await mkdtemp(join(tmpdir(), 'weighbridge-import-test-'));
    temps.push(dir);
    const handlers = createBridgeHandlers({ userDataDir: dir, dialogs: null, appRoot: repoRoot });
    const refused = await dispatchBridgeCall(handlers, 'previewSpreadsheet', [xlsx, { limits: { maxMegabytes: 0.01, maxSeconds: 30 } }]);
    if (refused.ok) throw new Error('The demo workbook is smaller than 0.01 MB; the test needs a larger file.');
    expect(refused.code).toBe('too-large');
    await page.getByRole('tab', { name: 'Import' }).click();
    const size = page.getByLabel('Largest file (MB)');
    expect(await size.inputValue()).toBe(String(DEFAULT_IMPORT_LIMITS_REQUEST.maxMegabytes));
    expect(await page.getByLabel('Time limit (s)').inputValue()).toBe(String(DEFAULT_IMPORT_LIMITS_REQUEST.maxSeconds));
    await size.fill('0.01');
    await size.press('Enter');
    await page.getByRole('button', { name: 'Choose a spreadsheet…' }).click();
    await answerPathDialog(page, xlsx);
    const alert = page.locator('.wb-import-error');
    await alert.waitFor();
    expect(await alert.locator('p').first().textContent()).toBe(refused.message);
    await size.fill('50');
    await size.press('Enter');
    await alert.getByRole('button', { name: 'Read again with these limits' }).click();
    await page.getByRole('region', { name: /^Preview of sheet / }).waitFor();
    expect(await alert.count()).toBe(0);
  });

  for (const colorScheme of ['light', 'dark'] as const) {
    it(`has no axe violations with a preview open (${colorScheme}) and writes a screenshot`, async () => {
      const { page } = await start({ colorScheme });
      await openImport(page, xlsx);
      await expect.poll(() => problemCounts(page)).not.toBe('checking…');
      const results = await runAxe(page);
      expect(describeViolations(results)).toEqual([]);
      await screenshot(page, `import-${colorScheme}`);
    });
  }
});
