// Results workspace, end to end: the real renderer in Chromium over the real main/services.
// Every expected sentence and number comes from the engine run in Node on the same demo course
// (gradeCourse, describeLine, neededOnPending, boundaryList) — the UI must show exactly those.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { CourseProject } from '../../renderer/bridge/contract';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import { describeLine } from '../../renderer/engine/grading/explain';
import { boundaryList, neededOnPending } from '../../renderer/engine/grading/whatIf';
import { loadDemoCourse } from '../../main/services/demo';
import { describeViolations, openApp, runAxe, screenshot, type AppSession } from './harness';

/** Wait for the page to catch up (a bound on waiting, not a timing assertion). */
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { timeout: 15_000, interval: 50 });

async function demo(): Promise<CourseProject> {
  const loaded = await loadDemoCourse();
  if (!loaded.ok) throw new Error(loaded.message);
  return loaded.value;
}

async function showResults(page: Page): Promise<void> {
  await page.getByRole('tab', { name: /Results/ }).click();
  await page.getByRole('heading', { level: 1, name: 'Results' }).waitFor();
}

async function selectStudent(page: Page, id: string, name: string): Promise<void> {
  await page.getByLabel('Find student').fill(id);
  await page.locator(`table.wb-finals tr[data-student-id="${id}"]`).getByRole('button', { name }).click();
  await page.getByRole('heading', { level: 2, name: new RegExp(name) }).waitFor();
}

const namesOf = (project: CourseProject) => ({
  category: (id: string) => project.plan.categories.find((c) => c.id === id)?.name ?? id,
  assessment: (id: string) => project.gradebook.assessments.find((a) => a.id === id)?.name ?? id,
});

describe('Results workspace (browser)', () => {
  let app: AppSession;
  let project: CourseProject;

  beforeAll(async () => {
    project = await demo();
    app = await openApp({ colorScheme: 'light' });
    await showResults(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('shows the caution next to the marks', async () => {
    const region = app.page.getByRole('region', { name: 'Results' });
    await poll(() => region.getByText("Review every mark against your institution's grading policy before submitting.", { exact: true }).isVisible()).toBe(true);
  });

  it('sorts by final mark both ways and filters by letter', async () => {
    const { page } = app;
    const finals = async () =>
      (await page.locator('table.wb-finals tbody tr[data-student-id] [data-final]').evaluateAll((els) => els.map((e) => e.getAttribute('data-final') ?? '')))
        .filter((v) => v !== '')
        .map(Number);
    const header = page.getByRole('columnheader', { name: /Final %/ });
    await header.getByRole('button').click();
    expect(await header.getAttribute('aria-sort')).toBe('ascending');
    const up = await finals();
    expect(up.length).toBeGreaterThan(5);
    expect(up).toEqual([...up].sort((a, b) => a - b));
    await header.getByRole('button').click();
    expect(await header.getAttribute('aria-sort')).toBe('descending');
    const down = await finals();
    expect(down).toEqual([...down].sort((a, b) => b - a));
    const results = gradeCourse(project.gradebook, project.plan);
    // The highest final in the list is the engine's highest final.
    expect(down[0]).toBe(Math.max(...results.students.flatMap((r) => (r.final === null ? [] : [r.final]))));

    const letter = results.students.find((r) => r.letter !== null)?.letter ?? '';
    await page.getByLabel('Letter').selectOption(letter);
    const expectedCount = results.students.filter((r) => r.letter === letter).length;
    await poll(() => page.locator('.wb-results-count').textContent()).toBe(`${expectedCount} of ${project.gradebook.students.length} students`);
    const letters = await page.locator('table.wb-finals tbody tr[data-student-id] td:nth-child(5)').allTextContents();
    expect(new Set(letters)).toEqual(new Set([letter]));
    await page.getByLabel('Letter').selectOption('');
  });

  it("explains a student's mark line by line in the engine's words, with the engine's effective weights", async () => {
    const { page } = app;
    const { gradebook, plan } = project;
    const results = gradeCourse(gradebook, plan);
    // The student with a waiver (demo-data/README.md: one A01 student has the midterm waived).
    const waiver = plan.studentWaivers[0];
    if (waiver === undefined) throw new Error('demo plan has no student waiver');
    const i = gradebook.students.findIndex((s) => s.id === waiver.studentId);
    const student = gradebook.students[i];
    const result = results.students[i];
    if (student === undefined || result === undefined) throw new Error('waived student not in the roster');

    await selectStudent(page, student.id, student.name);
    expect(await page.getByTestId('explanation-final').getAttribute('data-final')).toBe(String(result.final));
    const shown: Record<string, number> = {};
    for (const row of await page.getByTestId('explanation-weights').locator('tbody tr').all()) {
      shown[(await row.getAttribute('data-category-id')) ?? ''] = Number(await row.locator('[data-effective]').getAttribute('data-effective'));
    }
    expect(shown).toEqual(result.effectiveWeights);
    expect(result.effectiveWeights[waiver.categoryId]).toBe(0);

    const names = namesOf(project);
    const expectedSentences = result.lines.map((l) => describeLine(l, names));
    const shownSentences = await page.locator('.wb-explanation').locator('.wb-explain-category li, .wb-category-sentence, .wb-overall-lines li').allTextContents();
    expect(new Set(shownSentences)).toEqual(new Set(expectedSentences));
    expect(shownSentences).toHaveLength(expectedSentences.length);
    await page.getByLabel('Find student').fill('');
  });

  it('says what a student with pending work needs for each cutoff (neededOnPending)', async () => {
    const { page } = app;
    const { gradebook, plan } = project;
    const candidates = gradebook.students.map((_, i) => i).filter((i) => (gradebook.scores[i] ?? []).some((s) => s.kind === 'pending'));
    const found = candidates.map((i) => ({ i, needed: neededOnPending(gradebook, plan, i) })).find((c) => c.needed.some((n) => n.status === 'reachable'));
    if (found === undefined) throw new Error('no demo student can still change letter with pending work');
    const student = gradebook.students[found.i];
    if (student === undefined) throw new Error('bad index');
    await selectStudent(page, student.id, student.name);
    const text = (await page.getByTestId('whatif').textContent()) ?? '';
    for (const n of found.needed) {
      if (n.status === 'reachable' && n.neededPercent.defined) {
        expect(text).toContain(`Needs ${n.neededPercent.value} % on remaining work for ${n.letter} (${n.minPercent} %).`);
      }
    }
    await page.getByLabel('Find student').fill('');
  });

  it('lists the students just below a cutoff, as boundaryList does, for the margin chosen', async () => {
    const { page } = app;
    const results = gradeCourse(project.gradebook, project.plan);
    const byId = new Map(project.gradebook.students.map((s) => [s.id, s] as const));
    const region = page.getByRole('region', { name: 'Just below a cutoff' });
    for (const within of [1, 2]) {
      if (within !== 1) {
        const field = region.getByLabel('Within (points)');
        await field.fill(String(within));
        await field.press('Enter');
      }
      const expected = boundaryList(results.students, project.plan.scale, within).map((b) => byId.get(b.studentId)?.name ?? b.studentId);
      await poll(() => region.locator('tbody tr td:first-child').allTextContents()).toEqual(expected);
    }
  });

  it('has no axe violations (light) and writes a screenshot', async () => {
    const student = project.gradebook.students[0];
    if (student !== undefined) await selectStudent(app.page, student.id, student.name);
    await app.page.getByLabel('Find student').fill('');
    const results = await runAxe(app.page);
    expect(describeViolations(results)).toEqual([]);
    await screenshot(app.page, 'results-light');
    expect(app.pageErrors).toEqual([]);
  });

  it('has no axe violations in dark mode and writes a screenshot', async () => {
    const dark = await openApp({ colorScheme: 'dark' });
    try {
      await showResults(dark.page);
      const student = project.gradebook.students[0];
      if (student !== undefined) await selectStudent(dark.page, student.id, student.name);
      await dark.page.getByLabel('Find student').fill('');
      const results = await runAxe(dark.page);
      expect(describeViolations(results)).toEqual([]);
      await screenshot(dark.page, 'results-dark');
    } finally {
      await dark.close();
    }
  });
});
