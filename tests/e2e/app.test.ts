// The frame in real Chromium against the real services: start on the demo course under the
// app's CSP, keyboard and screen-reader basics, accessibility (axe-core, WCAG 2.x A/AA rules),
// save / re-open through the harness's path dialog, and the recovery copy offered on the next
// start. Expected values come from the services themselves (the bridge, the saved file), never
// from numbers written into the test.
import { afterEach, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import type { CourseProject, Result } from '../../renderer/bridge/contract';
import { loadProject } from '../../main/services/project';
import { CAUTION_TEXT } from '../../renderer/ui/app/caution';
import { answerPathDialog, describeViolations, openApp, repoRoot, runAxe, screenshot, type AppSession } from './harness';

const sessions: AppSession[] = [];
const temps: string[] = [];

async function start(opts?: Parameters<typeof openApp>[0]): Promise<AppSession> {
  const s = await openApp(opts);
  sessions.push(s);
  return s;
}

async function tempDir(): Promise<string> {
  const d = await mkdtemp(join(tmpdir(), 'weighbridge-app-test-'));
  temps.push(d);
  return d;
}

afterEach(async () => {
  await Promise.all(sessions.splice(0).map((s) => s.close()));
  await Promise.all(temps.splice(0).map((d) => rm(d, { recursive: true, force: true })));
});

/** The demo course as the services hand it to any window. */
async function demoViaBridge(page: Page): Promise<CourseProject> {
  const r = await page.evaluate(() => window.weighbridge!.demoCourse()) as Result<CourseProject>;
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

describe('app frame', { timeout: 90_000 }, () => {
  it('starts on the demo course with no console errors or CSP violations', async () => {
    const { page, pageErrors } = await start();
    const demo = await demoViaBridge(page);
    await expect.poll(() => page.getByRole('banner').getByRole('heading', { level: 1 }).textContent()).toBe(demo.title);
    await expect.poll(() => page.getByRole('banner').textContent()).toContain(`${demo.gradebook.students.length} students`);
    expect(await page.getByRole('note', { name: 'Caution' }).textContent()).toContain(CAUTION_TEXT);
    // The token left the address bar once read.
    expect(page.url()).not.toContain('token');
    // The page runs under the harness's header, and nothing was refused by it.
    const csp = await page.evaluate(() => fetch('./').then((r) => r.headers.get('content-security-policy')));
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("style-src 'self'");
    expect(pageErrors).toEqual([]);
  });

  it('opens the export dialog from any workspace with Ctrl+E and the toolbar button', async () => {
    const { page } = await start();
    await page.keyboard.press('Control+2');
    await page.keyboard.press('Control+E');
    const dialog = page.getByRole('dialog', { name: 'Export final marks' });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    await page.keyboard.press('Escape');
    await expect.poll(() => dialog.count()).toBe(0);
    await page.getByRole('toolbar', { name: 'Course commands' }).getByRole('button', { name: 'Export final marks…' }).click();
    await expect.poll(() => dialog.isVisible()).toBe(true);
  });

  it('has a workspace tab list that follows the keyboard (arrows, Ctrl+digit)', async () => {
    const { page } = await start();
    const tabs = page.getByRole('tablist', { name: 'Workspaces' }).getByRole('tab');
    const count = await tabs.count();
    expect(count).toBeGreaterThanOrEqual(1);
    const names = await tabs.allTextContents();
    expect(names.join(' ')).toContain('Import');
    // Exactly one tab is selected and the panel is labelled by it.
    expect(await page.locator('[role="tab"][aria-selected="true"]').count()).toBe(1);
    for (let i = count; i >= 1; i--) {
      await page.keyboard.press(`Control+${i}`);
      const selected = page.locator('[role="tab"][aria-selected="true"]');
      await expect.poll(() => selected.getAttribute('aria-keyshortcuts')).toBe(`Control+${i}`);
      const tabId = await selected.getAttribute('id');
      expect(await page.getByRole('tabpanel').getAttribute('aria-labelledby')).toBe(tabId);
    }
    await tabs.first().focus();
    await page.keyboard.press('End');
    expect(await page.locator('[role="tab"][aria-selected="true"]').getAttribute('aria-keyshortcuts')).toBe(`Control+${count}`);
    await page.keyboard.press('Home');
    expect(await page.locator('[role="tab"][aria-selected="true"]').getAttribute('aria-keyshortcuts')).toBe('Control+1');
  });

  for (const colorScheme of ['light', 'dark'] as const) {
    it(`has no axe violations in the frame (${colorScheme}) and writes a screenshot`, async () => {
      const { page } = await start({ colorScheme });
      // The frame around its own Import workspace; the other workspaces have their own axe tests.
      await page.getByRole('tab', { name: 'Import' }).click();
      await page.getByRole('heading', { name: 'Import a spreadsheet' }).waitFor();
      const results = await runAxe(page);
      expect(describeViolations(results)).toEqual([]);
      // The theme really follows the OS setting: the page background differs between schemes.
      const bg = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
      expect(bg).toBe(colorScheme === 'light' ? 'rgb(246, 245, 241)' : 'rgb(22, 24, 27)');
      const path = await screenshot(page, `frame-${colorScheme}`);
      expect(existsSync(path)).toBe(true);
    });
  }

  it('saves through the path dialog, then re-opens the file in a new window', async () => {
    const dir = await tempDir();
    const file = join(dir, 'course copy.weighbridge');
    const first = await start();
    const demo = await demoViaBridge(first.page);
    await first.page.getByRole('button', { name: 'Save', exact: true }).click();
    // Never saved: Save asks for a path, like Save as.
    await expect.poll(() => first.page.getByRole('dialog').getByRole('heading').textContent()).toBe('Save the course as');
    await answerPathDialog(first.page, file);
    await expect.poll(() => first.page.getByRole('banner').textContent()).toContain('All changes saved');
    expect(await first.page.getByRole('banner').textContent()).toContain(file);
    // The file on disk is the course shown, read back by the project store (validated load).
    const saved = await loadProject(file);
    expect(saved.ok).toBe(true);
    // (The demo's source.importedAt is stamped per call, so it is compared without it.)
    if (saved.ok) expect({ ...saved.value, source: saved.value.source?.sha256 }).toEqual({ ...demo, source: demo.source?.sha256 });

    const second = await start();
    await second.page.getByRole('button', { name: 'Open…' }).click();
    await answerPathDialog(second.page, file);
    await expect.poll(() => second.page.getByRole('banner').textContent()).toContain(file);
    expect(await second.page.getByRole('banner').getByRole('heading', { level: 1 }).textContent()).toBe(demo.title);
    expect(await second.page.getByRole('banner').textContent()).toContain('All changes saved');
  });

  it('says what is wrong with a path it cannot open, and keeps the open course', async () => {
    const dir = await tempDir();
    const { page } = await start();
    const title = await page.getByRole('banner').getByRole('heading', { level: 1 }).textContent();
    await page.keyboard.press('Control+o');
    await page.getByRole('dialog').getByLabel('File path').fill('not/absolute.weighbridge');
    await page.getByRole('dialog').getByLabel('File path').press('Enter');
    await expect.poll(() => page.getByRole('dialog').getByRole('alert').textContent()).toContain('full path');
    await answerPathDialog(page, join(dir, 'absent.weighbridge'));
    const alert = page.getByRole('alert').filter({ hasText: 'absent.weighbridge' });
    await alert.waitFor();
    expect(await page.getByRole('banner').getByRole('heading', { level: 1 }).textContent()).toBe(title);
  });

  it('sends a long recovery text through the page’s bridge as it is, and reads the same course back', async () => {
    const { page } = await start();
    // Notes of 2 000 000 characters, with the characters JSON must escape, push the text past the
    // length from which the harness bridge sends it raw (main/harness/server.ts).
    const result = await page.evaluate(async () => {
      const demo = await window.weighbridge!.demoCourse();
      if (!demo.ok) return { sent: demo, back: null, notes: '' };
      const notes = 'quote " backslash \\ newline \n tab \t ünïcödé '.repeat(60_000).slice(0, 2_000_000);
      const project = { ...demo.value, notes };
      const sent = await window.weighbridge!.writeRecovery(null, JSON.stringify(project));
      const back = await window.weighbridge!.readRecovery();
      return { sent, back, notes };
    });
    expect(result.sent.ok).toBe(true);
    const back = result.back as Result<{ project: CourseProject } | null> | null;
    expect(back?.ok && back.value?.project.notes).toBe(result.notes);
    expect(result.notes.length).toBe(2_000_000);
  });

  it('offers the recovery copy on the next start and restores it as unsaved work', async () => {
    const dir = await tempDir();
    const userDataDir = join(dir, 'user-data');
    const first = await start({ userDataDir });
    const demo = await demoViaBridge(first.page);
    // Make the course differ from any file: import the demo spreadsheet as a new course.
    await first.page.getByRole('tab', { name: /Import/ }).click();
    await first.page.getByRole('button', { name: 'Choose a spreadsheet…' }).click();
    await answerPathDialog(first.page, join(repoRoot, 'demo-data', 'glaciology-231.xlsx'));
    const load = first.page.getByRole('button', { name: 'Load into course' });
    await expect.poll(() => load.isEnabled(), { timeout: 15_000 }).toBe(true);
    await load.click();
    const heading = first.page.getByRole('banner').getByRole('heading', { level: 1 });
    await expect.poll(() => heading.textContent(), { timeout: 15_000 }).not.toBe(demo.title);
    const importedTitle = await heading.textContent();
    // The autosave writes the recovery copy after a quiet period; the save state says when.
    await first.page.getByText(/recovery copy/).waitFor({ timeout: 15_000 });
    await first.close();

    const second = await start({ userDataDir, waitForCourse: false });
    const offer = second.page.getByRole('dialog');
    await expect.poll(() => offer.getByRole('heading').textContent(), { timeout: 15_000 }).toMatch(/^Restore unsaved work from .+\?$/);
    await offer.getByRole('button', { name: 'Restore' }).click();
    await expect.poll(() => second.page.getByRole('banner').getByRole('heading', { level: 1 }).textContent()).toBe(importedTitle);
    expect(await second.page.getByRole('banner').textContent()).toContain('Unsaved course');
  });
});
