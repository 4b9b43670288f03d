// Printable report: the self-contained page from buildReportHtml (built here on a jsdom document,
// exactly as the function is pure over the document it is given), its numbers against the engine
// run in Node on the demo course, the page rendered and printed to PDF by Chromium (as the desktop
// shell's printToPDF will), and the in-app preview (axe, screenshot).
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CourseProject } from '../../renderer/bridge/contract';
import { sectionStatistics } from '../../renderer/engine/analysis/sectionStatistics';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import type { StudentResult } from '../../renderer/engine/results';
import { loadDemoCourse } from '../../main/services/demo';
import { EXPORT_CAUTION } from '../../renderer/ui/export/exportColumns';
import { buildReportHtml, REPORT_CAUTIONS } from '../../renderer/ui/report/buildReportHtml';
import { statRows } from '../../renderer/ui/sections/statRows';
import { describeViolations, openApp, repoRoot, runAxe, screenshot, screenshotDir, type AppSession } from './harness';

interface JsdomModule { JSDOM: new (html?: string) => { window: { document: Document; DOMParser: typeof DOMParser } } }

// jsdom ships no type declarations; a computed specifier keeps the (typed) cast above honest.
const jsdomName = 'jsdom';
const { JSDOM } = (await import(jsdomName)) as JsdomModule;

const DATE = new Date('2026-05-04T09:30:00Z');

describe('buildReportHtml (the standalone page)', () => {
  let project: CourseProject;
  let results: readonly StudentResult[];
  let html: string;
  let page: Document;

  beforeAll(async () => {
    const loaded = await loadDemoCourse();
    if (!loaded.ok) throw new Error(loaded.message);
    project = loaded.value;
    results = gradeCourse(project.gradebook, project.plan).students;
    html = buildReportHtml(new JSDOM('').window.document, project, results, { date: DATE });
    const dom = new JSDOM('');
    page = new dom.window.DOMParser().parseFromString(html, 'text/html');
    await mkdir(join(repoRoot, 'tests', 'artifacts'), { recursive: true });
    await writeFile(join(repoRoot, 'tests', 'artifacts', 'report.html'), html);
  });

  it('is one self-contained page: inline CSS, no script, no external reference, no inline style attribute', () => {
    expect(html.startsWith('<!doctype html>')).toBe(true);
    expect(page.querySelectorAll('style').length).toBe(1);
    expect(page.querySelector('style')?.textContent).toContain('.wb-report {');
    expect(page.querySelectorAll('script, link, iframe, img, object, embed').length).toBe(0);
    expect(page.querySelectorAll('[src], [href], [style]').length).toBe(0);
    expect(html).not.toMatch(/url\(\s*['"]?(https?:|\/\/)/);
  });

  it('holds the course and section statistics of the final marks exactly as the engine computes them', () => {
    const stats = sectionStatistics(project.gradebook, results, { measure: { kind: 'final' } });
    const groups = [{ key: 'course', summary: stats.course }, ...stats.sections.map((s) => ({ key: s.section, summary: s.summary }))];
    let checked = 0;
    for (const g of groups) {
      expect(page.querySelector(`td[data-stat="n"][data-section="${g.key}"]`)?.textContent).toBe(String(g.summary.n));
      for (const r of statRows('')) {
        const d = g.summary[r.key];
        if (!d.defined) continue;
        expect(Number(page.querySelector(`td[data-stat="${r.key}"][data-section="${g.key}"]`)?.getAttribute('data-value')), `${r.key} ${g.key}`).toBe(d.value);
        checked++;
      }
    }
    expect(checked).toBe(groups.length * statRows('').length);
  });

  it('honours the quartile method it is given', () => {
    const six = buildReportHtml(new JSDOM('').window.document, project, results, { date: DATE, quantileType: 6 });
    const doc = new (new JSDOM('').window.DOMParser)().parseFromString(six, 'text/html');
    const stats = sectionStatistics(project.gradebook, results, { measure: { kind: 'final' }, quantileType: 6 });
    const q1 = stats.course.q1;
    if (!q1.defined) throw new Error(q1.reason);
    expect(Number(doc.querySelector('td[data-stat="q1"][data-section="course"]')?.getAttribute('data-value'))).toBe(q1.value);
    expect(doc.body.textContent).toContain('Hyndman–Fan type 6');
  });

  it('has the four charts as inline SVG, one box per section', () => {
    const sections = new Set(project.gradebook.students.map((s) => s.section));
    for (const chart of ['boxplot', 'histogram', 'ecdf', 'letters']) expect(page.querySelectorAll(`figure[data-chart="${chart}"] svg`).length, chart).toBe(1);
    expect(page.querySelectorAll('figure[data-chart="boxplot"] g.wb-box rect').length).toBe(sections.size);
  });

  it('states the plan and scale in words, the date and the cautions', () => {
    const text = page.body.textContent ?? '';
    expect(text).toContain('2026-05-04');
    for (const c of project.plan.categories) expect(text).toContain(`${c.name}: weight ${c.weight}`);
    expect(text).toContain(`Grade scale “${project.plan.scale.name}”`);
    for (const cut of project.plan.scale.cutoffs) expect(page.querySelector('.wb-report-scale')?.textContent).toContain(cut.letter);
    expect(text).toContain(EXPORT_CAUTION);
    for (const c of REPORT_CAUTIONS) expect(text).toContain(c);
  });

  it('renders and prints to PDF in Chromium (what the desktop shell does with printToPDF)', async () => {
    const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
    try {
      const tab = await browser.newPage({ viewport: { width: 900, height: 1200 } });
      const errors: string[] = [];
      tab.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
      await tab.setContent(html);
      expect(await tab.locator('figure[data-chart] svg').count()).toBe(4);
      await mkdir(screenshotDir, { recursive: true });
      await tab.screenshot({ path: join(screenshotDir, 'report-page.png'), fullPage: true });
      const pdf = await tab.pdf({ format: 'A4', printBackground: true });
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      await writeFile(join(repoRoot, 'tests', 'artifacts', 'report.pdf'), pdf);
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});

describe('Report preview in the app (browser)', () => {
  let app: AppSession;
  let project: CourseProject;

  beforeAll(async () => {
    const loaded = await loadDemoCourse();
    if (!loaded.ok) throw new Error(loaded.message);
    project = loaded.value;
    app = await openApp({ colorScheme: 'light' });
    await app.page.getByRole('tab', { name: /Sections/ }).click();
    await app.page.getByRole('button', { name: 'Report' }).click();
    await app.page.getByRole('dialog', { name: 'Printable report' }).waitFor();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('shows the report with the engine’s numbers, passes axe, and closes', async () => {
    const { page } = app;
    const results = gradeCourse(project.gradebook, project.plan).students;
    const stats = sectionStatistics(project.gradebook, results, { measure: { kind: 'final' } });
    const mean = stats.course.mean;
    if (!mean.defined) throw new Error(mean.reason);
    const report = page.getByTestId('report');
    await expect.poll(() => report.locator('td[data-stat="mean"][data-section="course"]').getAttribute('data-value')).toBe(String(mean.value));
    expect(await report.locator('figure[data-chart] svg').count()).toBe(4);
    // The report's CSS reached the page (as a constructed stylesheet, which the CSP allows).
    expect(await report.locator('article.wb-report').evaluate((e) => getComputedStyle(e).backgroundColor)).toBe('rgb(255, 255, 255)');
    expect(describeViolations(await runAxe(page))).toEqual([]);
    await screenshot(page, 'report-preview');
    expect(app.pageErrors.join('\n')).toBe('');
    await page.getByRole('button', { name: 'Close' }).click();
    await page.getByRole('dialog', { name: 'Printable report' }).waitFor({ state: 'detached' });
  });
});
