// Roster workspace, end to end: the real renderer in Chromium over the real main/services.
// Which cells to look at, and the marks expected after an edit, come from the demo course and the
// engine run in Node (loadDemoCourse + gradeCourse) — never typed in.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import type { CourseProject } from '../../renderer/bridge/contract';
import type { Score } from '../../renderer/engine/model';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import { applyEdit } from '../../renderer/state/history';
import { loadDemoCourse } from '../../main/services/demo';
import { saveProject } from '../../main/services/project';
import { answerPathDialog, describeViolations, openApp, runAxe, screenshot, type AppSession } from './harness';

/** Wait for the page to catch up (a bound on waiting, not a timing assertion). */
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { timeout: 15_000, interval: 50 });

/** Columns before the assessments: student, section, final (RosterRow.tsx). */
const FIXED = 3;
/** Row and header heights in px (RosterRow.tsx). */
const ROW_HEIGHT = 34;
const HEADER_HEIGHT = 58;

/** Resolves after the next painted frame (requestAnimationFrame, then a task after it). */
const afterPaint = (page: Page) =>
  page.evaluate(() => new Promise<void>((resolve) => requestAnimationFrame(() => {
    const ch = new MessageChannel();
    ch.port1.onmessage = () => resolve();
    ch.port2.postMessage(null);
  })));

/**
 * The scroller's position and every body row in the DOM: its aria-rowindex, its top relative to
 * the grid's scrolled content (px, from the layout), and its row header's text.
 */
const screenRows = (page: Page) =>
  page.evaluate(() => {
    const scroller = document.querySelector<HTMLElement>('.wb-roster-scroll');
    const grid = document.querySelector<HTMLElement>('[role="grid"]');
    if (scroller === null || grid === null) throw new Error('no grid');
    const gridTop = grid.getBoundingClientRect().top;
    const rows = [...document.querySelectorAll<HTMLElement>('.wb-roster-body [role="row"]')].map((r) => ({
      rowindex: Number(r.getAttribute('aria-rowindex')),
      top: Math.round(r.getBoundingClientRect().top - gridTop),
      student: r.querySelector('[role="rowheader"]')?.textContent ?? '',
    }));
    return { scrollTop: scroller.scrollTop, height: scroller.clientHeight, rows };
  });

async function demo(): Promise<CourseProject> {
  const loaded = await loadDemoCourse();
  if (!loaded.ok) throw new Error(loaded.message);
  return loaded.value;
}

async function showRoster(page: Page): Promise<Locator> {
  await page.getByRole('tab', { name: /Roster/ }).click();
  const grid = page.getByRole('grid', { name: /Scores/ });
  await grid.waitFor();
  return grid;
}

async function search(page: Page, text: string): Promise<void> {
  await page.getByLabel('Find student').fill(text);
  await poll(() => page.locator('.wb-roster-count').textContent()).toMatch(/^1 of /);
}

const cell = (page: Page, row: number, col: number) => page.locator(`[data-cell="${row}:${col}"]`);
const focusedCell = (page: Page) => page.evaluate(() => document.activeElement?.getAttribute('data-cell') ?? null);

/** First (student, assessment) whose score satisfies `test`. */
function findCell(project: CourseProject, test: (s: Score, possible: number) => boolean): { s: number; a: number } {
  const { scores, assessments } = project.gradebook;
  for (let s = 0; s < scores.length; s++) {
    const row = scores[s] ?? [];
    for (let a = 0; a < row.length; a++) {
      const score = row[a];
      if (score !== undefined && test(score, assessments[a]?.possible ?? 0)) return { s, a };
    }
  }
  throw new Error('the demo course has no such cell');
}

describe('Roster workspace (browser)', () => {
  let app: AppSession;
  let project: CourseProject;

  beforeAll(async () => {
    project = await demo();
    app = await openApp({ colorScheme: 'light' });
    await showRoster(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('is a virtualised ARIA grid with points possible in the header', async () => {
    const { page } = app;
    const grid = page.getByRole('grid', { name: /Scores/ });
    const n = project.gradebook.students.length;
    expect(await grid.getAttribute('aria-rowcount')).toBe(String(n + 1));
    expect(await grid.getAttribute('aria-colcount')).toBe(String(FIXED + project.gradebook.assessments.length));
    // Only a window of rows is in the DOM.
    const rendered = await grid.getByRole('row').count();
    expect(rendered).toBeLessThan(Math.min(n, 80));
    const first = project.gradebook.assessments[0];
    if (first === undefined) throw new Error('demo has no assessments');
    await poll(() => grid.getByRole('columnheader').nth(FIXED).textContent()).toBe(`${first.name}of ${first.possible}`);
    // One tab stop.
    expect(await grid.locator('[tabindex="0"]').count()).toBe(1);
  });

  it('moves with arrows, Home/End, Ctrl+Home/End and PageDown (roving tabindex)', async () => {
    const { page } = app;
    const lastRow = project.gradebook.students.length - 1;
    const lastCol = FIXED + project.gradebook.assessments.length - 1;
    await cell(page, 0, FIXED).click();
    expect(await focusedCell(page)).toBe(`0:${FIXED}`);
    await page.keyboard.press('ArrowRight');
    expect(await focusedCell(page)).toBe(`0:${FIXED + 1}`);
    await page.keyboard.press('ArrowDown');
    expect(await focusedCell(page)).toBe(`1:${FIXED + 1}`);
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('ArrowUp'); // already at the top: stays
    expect(await focusedCell(page)).toBe(`0:${FIXED}`);
    await page.keyboard.press('End');
    expect(await focusedCell(page)).toBe(`0:${lastCol}`);
    await page.keyboard.press('Home');
    expect(await focusedCell(page)).toBe('0:0');
    await page.keyboard.press('Control+End');
    await poll(() => focusedCell(page)).toBe(`${lastRow}:${lastCol}`);
    const lastRowEl = page.locator(`[data-cell="${lastRow}:${lastCol}"]`).locator('xpath=..');
    expect(await lastRowEl.getAttribute('aria-rowindex')).toBe(String(lastRow + 2));
    await page.keyboard.press('Control+Home');
    await poll(() => focusedCell(page)).toBe('0:0');
    await page.keyboard.press('PageDown');
    const afterPage = await focusedCell(page);
    expect(Number(afterPage?.split(':')[0])).toBeGreaterThan(3);
    // The focused cell is the only tab stop.
    expect(await page.locator('[role="grid"] [tabindex="0"]').getAttribute('data-cell')).toBe(afterPage);
  });

  it('edits a score inline, refuses a bad one, and undo/redo restore value and final exactly', async () => {
    const { page } = app;
    const { gradebook } = project;
    const a = gradebook.assessments.findIndex((x) => x.name === 'Final exam');
    expect(a).toBeGreaterThanOrEqual(0);
    const s = gradebook.scores.findIndex((row) => row[a]?.kind === 'earned' && row[a].points >= 50);
    const student = gradebook.students[s];
    if (student === undefined) throw new Error('no student with an earned final exam');
    const newScore: Score = { kind: 'earned', points: 0 };
    const before = gradeCourse(gradebook, project.plan).students[s];
    const edited = applyEdit(project, { kind: 'setScore', studentIndex: s, assessmentIndex: a, score: newScore });
    const after = gradeCourse(edited.gradebook, edited.plan).students[s];
    if (before === undefined || after === undefined) throw new Error('engine returned no result');
    expect(after.final).not.toBe(before.final);

    await search(page, student.id);
    const target = cell(page, 0, FIXED + a);
    const finalCell = cell(page, 0, 2);
    const labelBefore = await target.getAttribute('aria-label');
    expect(await finalCell.getAttribute('data-final')).toBe(String(before.final));

    await target.click();
    await page.keyboard.press('Enter');
    const input = page.getByLabel(`Score for ${student.name}, Final exam, of 100 points`);
    await input.fill('abc');
    await input.press('Enter');
    await poll(() => page.getByRole('alert').filter({ hasText: 'Not changed' }).count()).toBe(1);
    expect(await input.getAttribute('aria-invalid')).toBe('true');
    await input.press('Escape');
    await poll(() => target.getAttribute('aria-label')).toBe(labelBefore);
    expect(await focusedCell(page)).toBe(`0:${FIXED + a}`);

    await page.keyboard.press('F2');
    await input.fill('0');
    await input.press('Enter');
    await poll(() => target.getAttribute('aria-label')).toBe('0 of 100');
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(after.final));

    await page.keyboard.press('Control+z');
    await poll(() => target.getAttribute('aria-label')).toBe(labelBefore);
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(before.final));

    await page.keyboard.press('Control+Shift+z');
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(after.final));
    await page.keyboard.press('Control+z');
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(before.final));
  });

  it('shows excused, missing, pending, above-possible and dropped cells with text and labels', async () => {
    const { page } = app;
    const results = gradeCourse(project.gradebook, project.plan);
    const checks: { where: { s: number; a: number }; text: RegExp; label: RegExp }[] = [
      { where: findCell(project, (x) => x.kind === 'excused'), text: /^EX$/, label: /^EX, excused$/ },
      { where: findCell(project, (x) => x.kind === 'missing'), text: /^—/, label: /^missing/ },
      { where: findCell(project, (x) => x.kind === 'pending'), text: /^…$/, label: /^pending$/ },
      { where: findCell(project, (x, possible) => x.kind === 'earned' && x.points > possible), text: /^▲ /, label: /above points possible/ },
    ];
    // A dropped item: from the engine's explanation lines.
    const dropped = results.students.flatMap((r, s) => r.lines.flatMap((l) => (l.kind === 'item' && l.status === 'dropped' ? [{ s, id: l.assessmentId }] : [])))[0];
    if (dropped === undefined) throw new Error('the demo course has no dropped item');
    const da = project.gradebook.assessments.findIndex((x) => x.id === dropped.id);
    checks.push({ where: { s: dropped.s, a: da }, text: /↓$/, label: /dropped by drop lowest/ });

    for (const c of checks) {
      const student = project.gradebook.students[c.where.s];
      if (student === undefined) throw new Error('bad index');
      await search(page, student.id);
      const el = cell(page, 0, FIXED + c.where.a);
      await poll(() => el.textContent()).toMatch(c.text);
      expect(await el.getAttribute('aria-label')).toMatch(c.label);
    }
    await page.getByLabel('Find student').fill('');
  });

  it('filters by section', async () => {
    const { page } = app;
    const n = project.gradebook.students.filter((s) => s.section === 'A03').length;
    await page.getByLabel('Section').selectOption('A03');
    await poll(() => page.locator('.wb-roster-count').textContent()).toMatch(new RegExp(`^${n} of ${project.gradebook.students.length} students`));
    expect(await page.getByRole('grid', { name: /Scores/ }).getAttribute('aria-rowcount')).toBe(String(n + 1));
    const sections = await page.locator('[role="grid"] [role="row"] [aria-colindex="2"][role="gridcell"]').allTextContents();
    expect(sections.length).toBeGreaterThan(0);
    expect(new Set(sections)).toEqual(new Set(['A03']));
    await page.getByLabel('Section').selectOption('');
  });

  it('shows the right rows in place after every long wheel step, top to bottom', async () => {
    const { page } = app;
    const { students } = project.gradebook;
    const scroller = page.locator('.wb-roster-scroll');
    await scroller.evaluate((el) => { el.scrollTop = 0; });
    const box = await scroller.boundingBox();
    if (box === null) throw new Error('the grid is not on screen');
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    let steps = 0;
    for (;;) {
      // 680 px, 20 rows: more than a screen, as bench/renderer.ts scrolls.
      await page.mouse.wheel(0, 20 * ROW_HEIGHT);
      await afterPaint(page);
      await afterPaint(page);
      const at = await screenRows(page);
      const firstOnScreen = Math.floor(at.scrollTop / ROW_HEIGHT);
      const lastOnScreen = Math.min(students.length - 1, Math.floor((at.scrollTop + at.height - HEADER_HEIGHT - 1) / ROW_HEIGHT));
      const byIndex = new Map(at.rows.map((r) => [r.rowindex - 2, r]));
      for (let i = firstOnScreen; i <= lastOnScreen; i++) {
        const r = byIndex.get(i);
        const student = students[i];
        if (student === undefined) throw new Error('bad index');
        expect(r, `row ${i} at scrollTop ${at.scrollTop}`).toBeDefined();
        expect(r?.top).toBe(HEADER_HEIGHT + i * ROW_HEIGHT);
        expect(r?.student).toBe(`${student.name}${student.id}`);
      }
      steps++;
      if (lastOnScreen === students.length - 1 || steps > students.length) break;
    }
    expect(steps).toBeGreaterThan(3);
    expect(await page.getByRole('grid', { name: /Scores/ }).getByRole('row').count()).toBeLessThan(80);
  });

  it('keeps focus on the active cell while the wheel scrolls it away, and arrows bring it back', async () => {
    const { page } = app;
    const scroller = page.locator('.wb-roster-scroll');
    await scroller.evaluate((el) => { el.scrollTop = 0; });
    await afterPaint(page);
    await cell(page, 1, FIXED).click();
    expect(await focusedCell(page)).toBe(`1:${FIXED}`);
    for (let i = 0; i < 5; i++) {
      await page.mouse.wheel(0, 20 * ROW_HEIGHT);
      await afterPaint(page);
    }
    expect(await scroller.evaluate((el) => el.scrollTop)).toBeGreaterThan(40 * ROW_HEIGHT);
    // The active row stays in the DOM (out of the scrolled window), still focused.
    expect(await focusedCell(page)).toBe(`1:${FIXED}`);
    expect(await page.locator('[role="grid"] [tabindex="0"]').getAttribute('data-cell')).toBe(`1:${FIXED}`);
    await page.keyboard.press('ArrowDown');
    await poll(() => focusedCell(page)).toBe(`2:${FIXED}`);
    await poll(() => scroller.evaluate((el) => el.scrollTop)).toBeLessThanOrEqual(2 * ROW_HEIGHT);
    const rows = (await screenRows(page)).rows;
    expect(rows.find((r) => r.rowindex === 4)?.top).toBe(HEADER_HEIGHT + 2 * ROW_HEIGHT);
  });

  it('a row that stays on screen shows an edit, its undo and its redo (double-click edits)', async () => {
    const { page } = app;
    const { gradebook } = project;
    await page.locator('.wb-roster-scroll').evaluate((el) => { el.scrollTop = 0; el.scrollLeft = 0; });
    await afterPaint(page);
    const assessment = gradebook.assessments[0];
    if (assessment === undefined) throw new Error('demo has no assessments');
    const statusOf = (r: ReturnType<typeof gradeCourse>['students'][number] | undefined) =>
      r?.lines.find((l) => l.kind === 'item' && l.assessmentId === assessment.id);
    const graded = gradeCourse(gradebook, project.plan).students;
    // A student on the first screen with an earned, non-zero, counted score in the first assessment.
    const s = gradebook.scores.slice(0, 8).findIndex((row, i) => {
      const line = statusOf(graded[i]);
      return row[0]?.kind === 'earned' && row[0].points > 0 && line?.kind === 'item' && line.status !== 'dropped';
    });
    const student = gradebook.students[s];
    const old = gradebook.scores[s]?.[0];
    if (student === undefined || old?.kind !== 'earned') throw new Error('no such cell on the first screen');
    const edited = applyEdit(project, { kind: 'setScore', studentIndex: s, assessmentIndex: 0, score: { kind: 'earned', points: 0 } });
    const before = graded[s];
    const after = gradeCourse(edited.gradebook, edited.plan).students[s];
    if (before === undefined || after === undefined) throw new Error('engine returned no result');
    // After the edit the engine may drop the zero (drop lowest): the cell must say so too.
    const line = statusOf(after);
    const dropped = line?.kind === 'item' && line.status === 'dropped';
    const textAfter = dropped ? '0↓' : '0';
    const labelAfter = `0 of ${assessment.possible}${dropped ? ', dropped by drop lowest' : ''}`;

    const target = cell(page, s, FIXED);
    const finalCell = cell(page, s, 2);
    const textBefore = await target.textContent();
    const labelBefore = await target.getAttribute('aria-label');
    expect(textBefore).toBe(String(old.points));
    await target.dblclick();
    const input = page.getByLabel(`Score for ${student.name}, ${assessment.name}, of ${assessment.possible} points`);
    await input.fill('0');
    await input.press('Escape');
    await poll(() => target.textContent()).toBe(textBefore); // Escape kept the old score
    await target.dblclick();
    await input.fill('0');
    await input.press('Enter');
    await poll(() => target.textContent()).toBe(textAfter);
    expect(await target.getAttribute('aria-label')).toBe(labelAfter);
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(after.final));
    await page.keyboard.press('Control+z');
    await poll(() => target.textContent()).toBe(textBefore);
    expect(await target.getAttribute('aria-label')).toBe(labelBefore);
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(before.final));
    await page.keyboard.press('Control+Shift+z');
    await poll(() => target.textContent()).toBe(textAfter);
    await poll(() => finalCell.getAttribute('data-final')).toBe(String(after.final));
    await page.keyboard.press('Control+z');
    await poll(() => target.textContent()).toBe(textBefore);
  });

  it('has no axe violations (light) and writes a screenshot', async () => {
    const results = await runAxe(app.page);
    expect(describeViolations(results)).toEqual([]);
    await screenshot(app.page, 'roster-light');
    expect(app.pageErrors).toEqual([]);
  });

  it('stays virtualised with 10 000+ students: few rows in the DOM, Ctrl+End reaches the last, edits undo', async () => {
    // The demo roster repeated 48 times under new IDs (a size test, not evidence about marks).
    const copies = 48;
    const base = project.gradebook;
    const big: CourseProject = {
      ...project,
      title: 'Large roster',
      gradebook: {
        assessments: base.assessments,
        students: Array.from({ length: copies }, (_, k) => base.students.map((st) => ({ ...st, id: `${st.id}-${k}` }))).flat(),
        scores: Array.from({ length: copies }, () => base.scores).flat(),
      },
    };
    const n = big.gradebook.students.length;
    expect(n).toBeGreaterThan(10_000);
    const dir = await mkdtemp(join(tmpdir(), 'wb-roster-big-'));
    const session = await openApp({ colorScheme: 'light' });
    try {
      const path = join(dir, 'large.weighbridge');
      const saved = await saveProject(path, big);
      if (!saved.ok) throw new Error(saved.message);
      const { page } = session;
      await page.getByRole('button', { name: 'Open…' }).click();
      await answerPathDialog(page, path);
      await page.getByText('Large roster').first().waitFor({ timeout: 30_000 });
      const grid = await showRoster(page);
      await poll(() => grid.getAttribute('aria-rowcount')).toBe(String(n + 1));
      expect(await grid.getByRole('row').count()).toBeLessThan(80);

      await cell(page, 0, FIXED).click();
      await page.keyboard.press('Control+End');
      const lastCol = FIXED + big.gradebook.assessments.length - 1;
      await poll(() => focusedCell(page)).toBe(`${n - 1}:${lastCol}`);
      expect(await grid.getByRole('row').count()).toBeLessThan(80);
      const last = big.gradebook.students[n - 1];
      if (last === undefined) throw new Error('no last student');
      expect(await cell(page, n - 1, 0).textContent()).toContain(last.id);

      const target = cell(page, n - 1, lastCol);
      const labelBefore = await target.getAttribute('aria-label');
      await page.keyboard.press('Enter');
      await page.keyboard.press('Control+a');
      await page.keyboard.type('EX');
      await page.keyboard.press('Enter');
      await poll(() => target.getAttribute('aria-label')).toBe('EX, excused');
      await page.keyboard.press('Control+z');
      await poll(() => target.getAttribute('aria-label')).toBe(labelBefore);
    } finally {
      await session.close();
      await rm(dir, { recursive: true, force: true });
    }
  });

  it('has no axe violations in dark mode and writes a screenshot', async () => {
    const dark = await openApp({ colorScheme: 'dark' });
    try {
      await showRoster(dark.page);
      const results = await runAxe(dark.page);
      expect(describeViolations(results)).toEqual([]);
      await screenshot(dark.page, 'roster-dark');
    } finally {
      await dark.close();
    }
  });
});
