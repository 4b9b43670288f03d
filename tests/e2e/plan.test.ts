// Plan workspace, end to end: the real renderer in Chromium over the real main/services.
// Expected values are never typed in: they come from the engine (gradeCourse) run in Node on the
// same demo course with the same plan change (planEdits), so the UI must show exactly what the
// engine computes — no rounding, no copy of a rule in the UI.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { CourseProject } from '../../renderer/bridge/contract';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import * as edits from '../../renderer/state/planEdits';
import { loadDemoCourse } from '../../main/services/demo';
import { describeViolations, openApp, runAxe, screenshot, type AppSession } from './harness';

/** Wait for the page to catch up (a bound on waiting, not a timing assertion). */
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { timeout: 15_000, interval: 50 });

async function demo(): Promise<CourseProject> {
  const loaded = await loadDemoCourse();
  if (!loaded.ok) throw new Error(loaded.message);
  return loaded.value;
}

async function showPlan(page: Page): Promise<void> {
  await page.getByRole('tab', { name: /Plan/ }).click();
  await page.getByRole('heading', { level: 1, name: 'Plan' }).waitFor();
}

/** Ctrl+Z inside a text field is the field's own undo; the course's undo needs focus elsewhere. */
async function leaveField(page: Page): Promise<void> {
  await page.getByRole('heading', { level: 1, name: 'Plan' }).click();
}

/** Find the student by ID in the picker and choose them (option values are roster indices). */
async function chooseStudent(page: Page, project: CourseProject, index: number): Promise<void> {
  const student = project.gradebook.students[index];
  if (student === undefined) throw new Error(`no student at index ${index}`);
  const panel = page.getByRole('region', { name: 'Weights for one student' });
  await panel.getByLabel('Student: find by name or ID').fill(student.id);
  await panel.getByRole('combobox', { name: 'Student', exact: true }).selectOption(String(index));
}

/** Effective weights shown for the chosen student, by category id, as the numbers the page holds. */
async function shownWeights(page: Page): Promise<Record<string, number>> {
  const cells = page.getByTestId('plan-student-weights').locator('tbody tr');
  const out: Record<string, number> = {};
  for (const row of await cells.all()) {
    const id = await row.getAttribute('data-category-id');
    const value = await row.locator('[data-effective]').getAttribute('data-effective');
    if (id !== null && value !== null) out[id] = Number(value);
  }
  return out;
}

describe('Plan workspace (browser)', () => {
  let app: AppSession;
  let project: CourseProject;

  beforeAll(async () => {
    project = await demo();
    app = await openApp({ colorScheme: 'light' });
    await showPlan(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('waiving a category for one section gives that section exactly the engine’s weights and finals, and undo restores them', async () => {
    const { page } = app;
    const { gradebook } = project;
    const section = 'A02';
    const studentIndex = gradebook.students.findIndex((s) => s.section === section);
    const student = gradebook.students[studentIndex];
    expect(student).toBeDefined();
    if (student === undefined) return;

    const before = gradeCourse(gradebook, project.plan).students[studentIndex];
    const waivedPlan = edits.addSectionWaiver(project.plan, section, 'labs', 'lab building closed');
    const graded = gradeCourse(gradebook, waivedPlan);
    const after = graded.students[studentIndex];
    if (before === undefined || after === undefined) throw new Error('engine returned no result for the student');
    // The change must matter, or this test could not fail.
    expect(after.effectiveWeights).not.toEqual(before.effectiveWeights);

    await chooseStudent(page, project, studentIndex);
    expect(await shownWeights(page)).toEqual(before.effectiveWeights);

    const form = page.getByRole('form', { name: 'Add a section waiver' });
    await form.getByLabel('Section').selectOption(section);
    await form.getByLabel('Category to waive').selectOption({ label: 'Labs' });
    await form.getByLabel('Note').fill('lab building closed');
    await form.getByRole('button', { name: 'Waive for section' }).click();

    await poll(() => page.getByTestId('section-waiver').filter({ hasText: `waived for section ${section}` }).filter({ hasText: 'Labs' }).count()).toBe(1);
    await poll(() => shownWeights(page)).toEqual(after.effectiveWeights);
    expect(await page.getByTestId('plan-student-final').locator('[data-final]').getAttribute('data-final')).toBe(String(after.final));

    // Every student of the section, read from the Results list filtered to that section.
    await page.getByRole('tab', { name: /Results/ }).click();
    await page.getByLabel('Section', { exact: true }).selectOption(section);
    const rows = page.locator('table.wb-finals tbody tr[data-student-id]');
    await poll(() => rows.count()).toBeGreaterThan(5);
    const byId = new Map(gradebook.students.map((s, i) => [s.id, i] as const));
    for (const row of await rows.all()) {
      const id = await row.getAttribute('data-student-id');
      const final = await row.locator('[data-final]').getAttribute('data-final');
      const i = id === null ? undefined : byId.get(id);
      expect(i).toBeDefined();
      const expected = i === undefined ? undefined : graded.students[i];
      expect(gradebook.students[i ?? -1]?.section).toBe(section);
      expect(final).toBe(expected?.final === null || expected === undefined ? '' : String(expected.final));
    }

    // Undo goes back to the plan as it was.
    await showPlan(page);
    await page.keyboard.press('Control+z');
    await poll(() => page.getByTestId('section-waiver').filter({ hasText: `waived for section ${section}` }).count()).toBe(0);
    await chooseStudent(page, project, studentIndex);
    await poll(() => shownWeights(page)).toEqual(before.effectiveWeights);
  });

  it('shows the live weight sum and warns when it is not 100', async () => {
    const { page } = app;
    const sum = page.getByTestId('weight-sum');
    await poll(() => sum.textContent()).toContain('100 %');
    expect(await page.getByTestId('weight-warning').count()).toBe(0);
    const weight = page.getByLabel('Weight of Labs');
    await weight.fill('20');
    await weight.press('Enter');
    // Demo weights 15 + 10 + 25 + 20 + 30 = 100 (demo-data/README.md); Labs 15 → 20 makes 105.
    await poll(() => sum.textContent()).toContain('105 %');
    await poll(() => page.getByTestId('weight-warning').textContent()).toContain('re-normalised');
    await leaveField(page);
    await page.keyboard.press('Control+z');
    await poll(() => page.getByTestId('weight-warning').count()).toBe(0);
  });

  it('refuses a bad value with a message, changes nothing and shows the plan value again', async () => {
    const { page } = app;
    const undo = page.getByRole('button', { name: /^Undo/ });
    const undoBefore = await undo.getAttribute('aria-label');
    const cap = page.getByLabel('Cap percent of Labs (blank for none)');
    expect(await cap.inputValue()).toBe('');
    await cap.fill('0');
    await cap.press('Enter');
    // The message is planEdits' own (setCategoryRules refuses a cap ≤ 0).
    await poll(() => page.getByRole('alert').filter({ hasText: 'A category cap must be a percent > 0' }).count()).toBe(1);
    await poll(() => page.getByLabel('Cap percent of Labs (blank for none)').inputValue()).toBe('');
    expect(await undo.getAttribute('aria-label')).toBe(undoBefore);
  });

  it('offers drop lowest 0 … items − 1 and applies a choice', async () => {
    const { page } = app;
    const labs = Object.values(project.plan.items).filter((r) => r.categoryId === 'labs' && !r.extraCredit).length;
    const drop = page.getByLabel('Drop lowest N in Labs');
    expect(await drop.locator('option').allTextContents()).toEqual(Array.from({ length: labs }, (_, n) => String(n)));
    await drop.selectOption('2');
    await poll(() => page.getByRole('button', { name: /^Undo/ }).getAttribute('aria-label')).toBe('Undo Labs: drop lowest 2');
    await leaveField(page);
    await page.keyboard.press('Control+z');
    await poll(() => page.getByLabel('Drop lowest N in Labs').inputValue()).toBe(String(project.plan.categories.find((c) => c.id === 'labs')?.dropLowest));
  });

  it('shows the scale problems validateScale reports', async () => {
    const { page } = app;
    const letter = page.getByLabel('Letter of cutoff 2', { exact: true });
    const original = await letter.inputValue();
    const first = await page.getByLabel('Letter of cutoff 1', { exact: true }).inputValue();
    await letter.fill(first);
    await letter.press('Enter');
    await poll(() => page.getByTestId('scale-problems').textContent()).toContain(`"${first}" appears more than once`);
    await leaveField(page);
    await page.keyboard.press('Control+z');
    await poll(() => page.getByLabel('Letter of cutoff 2', { exact: true }).inputValue()).toBe(original);
    expect(await page.getByTestId('scale-problems').count()).toBe(0);
  });

  it('has no axe violations (light) and writes a screenshot', async () => {
    const results = await runAxe(app.page);
    expect(describeViolations(results)).toEqual([]);
    await screenshot(app.page, 'plan-light');
    expect(app.pageErrors).toEqual([]);
  });

  it('has no axe violations in dark mode and writes a screenshot', async () => {
    const dark = await openApp({ colorScheme: 'dark' });
    try {
      await showPlan(dark.page);
      await chooseStudent(dark.page, project, 0);
      const results = await runAxe(dark.page);
      expect(describeViolations(results)).toEqual([]);
      await screenshot(dark.page, 'plan-dark');
    } finally {
      await dark.close();
    }
  });
});
