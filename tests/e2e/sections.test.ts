// Sections workspace, end to end: the real renderer in Chromium over the real main/services.
// Every expected number is computed here in Node by the engine on the same demo course
// (loadDemoCourse → gradeCourse → sectionStatistics / histogram / ecdf / itemAnalysis /
// compareSections); the screen — table cells and the charts' DOM — must show exactly those.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { CourseProject } from '../../renderer/bridge/contract';
import { compareSections } from '../../renderer/engine/analysis/compareSections';
import { itemAnalysis } from '../../renderer/engine/analysis/itemAnalysis';
import { sectionStatistics, type SectionStatistics } from '../../renderer/engine/analysis/sectionStatistics';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import { ecdf } from '../../renderer/engine/stats/ecdf';
import { histogram, type BinRule } from '../../renderer/engine/stats/histogram';
import { QUANTILE_TYPES, type QuantileType } from '../../renderer/engine/stats/quantile';
import type { StudentResult } from '../../renderer/engine/results';
import type { Measure } from '../../renderer/engine/analysis/measure';
import { loadDemoCourse } from '../../main/services/demo';
import { statRows } from '../../renderer/ui/sections/statRows';
import { describeViolations, openApp, runAxe, screenshot, type AppSession } from './harness';

const COURSE = '__course__';

async function showSections(page: Page): Promise<void> {
  await page.getByRole('tab', { name: /Sections/ }).click();
  await page.getByRole('heading', { level: 1, name: 'Sections' }).waitFor();
  // Charts below the statistics table, the comparison and the item analysis follow the first
  // paint (drawn and computed in slices): wait until all four charts show the current numbers.
  await page.waitForFunction(() => document.querySelectorAll('.wb-chart-host[data-drawn="true"]').length === 4);
  await page.getByTestId('comparison').waitFor();
  await page.getByTestId('item-analysis').waitFor();
}

/**
 * A chart below the screen is redrawn just after a change, not in the same frame (drawSoon.ts):
 * wait until the SVG shown is the one for the current inputs before reading it.
 */
async function chartDrawn(page: Page, chart: string): Promise<void> {
  await page.locator(`figure[data-chart="${chart}"] .wb-chart-host[data-drawn="true"]`).waitFor({ state: 'attached' });
}

interface Cell { stat: string; section: string; value: string | null; text: string; defined: boolean }

async function tableCells(page: Page): Promise<Map<string, Cell>> {
  const cells = await page.locator('[data-testid="section-statistics"] td[data-stat]').evaluateAll((els) =>
    els.map((e) => ({
      stat: e.getAttribute('data-stat') ?? '',
      section: e.getAttribute('data-section') ?? '',
      value: e.getAttribute('data-value'),
      text: (e.textContent ?? '').trim(),
      defined: e.getAttribute('data-defined') !== 'false',
    })),
  );
  return new Map(cells.map((c) => [`${c.stat}|${c.section}`, c]));
}

function groups(stats: SectionStatistics) {
  return [{ key: COURSE, summary: stats.course }, ...stats.sections.map((s) => ({ key: s.section, summary: s.summary }))];
}

async function outliersShown(page: Page): Promise<Record<string, string[]>> {
  const items = await page.locator('[data-testid="section-statistics"] td[data-stat="outliers"]').evaluateAll((tds) =>
    tds.map((td) => ({ section: td.getAttribute('data-section') ?? '', names: Array.from(td.querySelectorAll('li[data-outlier]'), (li) => li.getAttribute('data-outlier') ?? '') })),
  );
  return Object.fromEntries(items.map((i) => [i.section, i.names]));
}

function outliersExpected(stats: SectionStatistics): Record<string, string[]> {
  return Object.fromEntries(groups(stats).map((g) => [g.key, g.summary.outliers.map((o) => o.label)]));
}

describe('Sections workspace (browser)', () => {
  let app: AppSession;
  let project: CourseProject;
  let results: readonly StudentResult[];
  const stats = (quantileType: QuantileType = 7) => sectionStatistics(project.gradebook, results, { quantileType, measure: { kind: 'final' } });

  beforeAll(async () => {
    const loaded = await loadDemoCourse();
    if (!loaded.ok) throw new Error(loaded.message);
    project = loaded.value;
    results = gradeCourse(project.gradebook, project.plan).students;
    app = await openApp({ colorScheme: 'light' });
    await showSections(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('the statistics table holds exactly the engine values, for the course and every section', async () => {
    const expected = stats();
    const cells = await tableCells(app.page);
    const keys = statRows('').map((r) => r.key);
    expect(expected.sections.length).toBeGreaterThan(1);
    for (const g of groups(expected)) {
      expect(cells.get(`n|${g.key}`)?.value).toBe(String(g.summary.n));
      for (const key of keys) {
        const d = g.summary[key];
        const cell = cells.get(`${key}|${g.key}`);
        expect(cell, `${key} for ${g.key}`).toBeDefined();
        if (d.defined) {
          // data-value is the engine's number, unrounded; the visible text is it rounded for display.
          expect(Number(cell?.value), `${key} for ${g.key}`).toBe(d.value);
          const shown = Number((cell?.text ?? '').replace('−', '-').replace(/\s*%$/, ''));
          expect(Math.abs(shown - (key === 'cv' ? d.value * 100 : d.value))).toBeLessThanOrEqual((key === 'cv' ? 0.05 : 0.005) + 1e-9);
        } else {
          expect(cell?.defined).toBe(false);
          expect(cell?.text).toContain(d.reason);
        }
      }
    }
    expect(await outliersShown(app.page)).toEqual(outliersExpected(expected));
  });

  it('changing the quartile method changes Q1, Q3 and the outlier list exactly as the engine says', async () => {
    // The first measure (final, then categories, then assessments) and Hyndman–Fan type under
    // which the engine's outlier verdict differs from type 7 on this course.
    const measures: { value: string; measure: Measure }[] = [
      { value: 'final', measure: { kind: 'final' } },
      ...project.plan.categories.map((c) => ({ value: `cat:${c.id}`, measure: { kind: 'category', categoryId: c.id } as Measure })),
      ...project.gradebook.assessments.map((a) => ({ value: `asm:${a.id}`, measure: { kind: 'assessment', assessmentId: a.id } as Measure })),
    ];
    const of = (m: Measure, t: QuantileType) => sectionStatistics(project.gradebook, results, { quantileType: t, measure: m });
    const found = measures.flatMap((m) => QUANTILE_TYPES.map((t) => ({ ...m, t }))).find(
      (x) => JSON.stringify(outliersExpected(of(x.measure, x.t))) !== JSON.stringify(outliersExpected(of(x.measure, 7))),
    );
    expect(found, 'some measure and Hyndman–Fan type change the outliers of the demo course').toBeDefined();
    const { value, measure, t } = found!;
    const base = of(measure, 7);
    await app.page.getByTestId('measure').selectOption(value);
    await expect.poll(async () => outliersShown(app.page)).toEqual(outliersExpected(base));
    await app.page.getByTestId('quantile-type').selectOption(String(t));
    const after = of(measure, t);
    await expect.poll(async () => outliersShown(app.page)).toEqual(outliersExpected(after));
    const cells = await tableCells(app.page);
    let differs = 0;
    for (const g of groups(after)) {
      for (const key of ['q1', 'q3', 'lowerFence', 'upperFence'] as const) {
        const d = g.summary[key];
        if (!d.defined) throw new Error(`${key} not defined for ${g.key}`);
        expect(Number(cells.get(`${key}|${g.key}`)?.value)).toBe(d.value);
      }
      const before = groups(base).find((b) => b.key === g.key)?.summary;
      if (before?.q1.defined && g.summary.q1.defined && before.q1.value !== g.summary.q1.value) differs++;
    }
    expect(differs).toBeGreaterThan(0);
    await chartDrawn(app.page, 'boxplot');
    await expect.poll(() => app.page.locator('figure[data-chart="boxplot"] g.wb-outlier circle').count()).toBe(after.sections.reduce((s, x) => s + x.summary.outliers.length, 0));
    await app.page.getByTestId('quantile-type').selectOption('7');
    await expect.poll(async () => outliersShown(app.page)).toEqual(outliersExpected(base));
    await app.page.getByTestId('measure').selectOption('final');
  });

  it('box plot: one box per section, one dot per outlier (read from the SVG)', async () => {
    const s = stats();
    const fig = app.page.locator('figure[data-chart="boxplot"]');
    expect(await fig.locator('g.wb-box rect').count()).toBe(s.sections.length);
    expect(await fig.locator('g.wb-median line').count()).toBe(s.sections.length);
    expect(await fig.locator('g.wb-outlier circle').count()).toBe(s.sections.reduce((n, x) => n + x.summary.outliers.length, 0));
    // Hover values: each box carries a <title> with its five numbers.
    const titles = await fig.locator('g.wb-box rect title').allTextContents();
    expect(titles.map((x) => x.split(' ')[0])).toEqual(s.sections.map((x) => x.section));
  });

  it('box plot values are reachable from the keyboard', async () => {
    const s = stats();
    const fig = app.page.locator('figure[data-chart="boxplot"]');
    await fig.focus();
    await app.page.keyboard.press('ArrowRight');
    const first = s.sections[0]!;
    await expect.poll(() => fig.locator('figcaption').textContent()).toContain(`Section ${first.section}, n = ${first.summary.n}`);
    await app.page.keyboard.press('End');
    await expect.poll(() => fig.locator('figcaption').textContent()).toContain(`Section ${s.sections.at(-1)!.section}`);
  });

  it('every chart is keyboard reachable, named, and has its numbers as a table', async () => {
    // The tables are built when their toggle opens.
    const toggles = app.page.locator('.wb-chart-table > summary');
    for (const summary of await toggles.all()) await summary.click();
    // The toggle event (and so the build) follows the click in a later task.
    await expect.poll(() => app.page.locator('.wb-chart-table table').count()).toBe(await toggles.count());
    const figures = await app.page.locator('figure.wb-chart').evaluateAll((els) =>
      els.map((e) => ({ chart: e.getAttribute('data-chart'), tabindex: e.getAttribute('tabindex'), labelledBy: e.getAttribute('aria-labelledby'), tables: e.parentElement?.querySelectorAll('details table').length ?? 0 })),
    );
    expect(figures.map((f) => f.chart)).toEqual(['boxplot', 'histogram', 'ecdf', 'letters']);
    for (const f of figures) {
      expect(f.tabindex).toBe('0');
      expect(f.labelledBy).not.toBeNull();
      expect(f.tables).toBe(1);
    }
    for (const summary of await toggles.all()) await summary.click();
    await expect.poll(() => app.page.locator('.wb-chart-table table').count()).toBe(0);
  });

  it('histogram: the bins drawn are histogram()’s bins for each rule', async () => {
    const values = stats().courseValues;
    const fig = app.page.locator('figure[data-chart="histogram"]');
    const rules: [string, BinRule][] = [
      ['sturges', { kind: 'sturges' }],
      ['scott', { kind: 'scott' }],
      ['freedmanDiaconis', { kind: 'freedmanDiaconis' }],
      ['fixed', { kind: 'fixed', width: 5 }],
    ];
    const counts = new Set<number>();
    for (const [option, rule] of rules) {
      const h = histogram(values, rule);
      if (!h.defined) throw new Error(h.reason);
      await app.page.getByTestId('bin-rule').selectOption(option);
      await chartDrawn(app.page, 'histogram');
      await expect.poll(() => fig.locator('g.wb-bin rect').count()).toBe(h.value.bins.length);
      const shown = (await fig.locator('g.wb-bin rect title').allTextContents()).map((t) => Number(/: (\d+) students$/.exec(t)?.[1]));
      expect(shown).toEqual(h.value.bins.map((b) => b.count));
      counts.add(h.value.bins.length);
    }
    expect(counts.size).toBeGreaterThan(1); // the rules really differ on this course
    // The grade cutoffs that fall inside the histogram's range are drawn as reference lines.
    await app.page.getByTestId('bin-rule').selectOption('sturges');
    const sturges = histogram(values, { kind: 'sturges' });
    if (!sturges.defined) throw new Error(sturges.reason);
    const lo = sturges.value.bins[0]!.lower;
    const hi = sturges.value.bins.at(-1)!.upper;
    const inside = project.plan.scale.cutoffs.filter((c) => c.minPercent > lo && c.minPercent <= hi);
    expect(inside.length).toBeGreaterThan(0);
    await expect.poll(() => fig.locator('g.wb-cutoff line').count()).toBe(inside.length);
    await app.page.getByTestId('bin-rule').selectOption('sturges');
  });

  it('ECDF: one step per distinct value in each section, and the movable mark reads F(t) per section', async () => {
    const s = stats();
    const fig = app.page.locator('figure[data-chart="ecdf"]');
    for (const sec of s.sections) {
      // One step-after path per section: its levels are 0 and one share per distinct value, so the
      // distinct y coordinates of its vertices count the steps drawn (plus the 0 level).
      const d = await fig.locator(`g[aria-label="ECDF steps, section ${sec.section}"] path`).getAttribute('d');
      const ys = new Set([...(d ?? '').matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g)].map((m) => m[2]));
      expect(ys.size - 1, sec.section).toBe(new Set(sec.values).size);
    }
    const slider = app.page.getByLabel('Mark at');
    const t = 70;
    await slider.fill(String(t));
    for (const sec of s.sections) {
      const expected = ecdf(sec.values).at(t);
      await expect.poll(() => app.page.locator(`[data-testid="ecdf-shares"] li[data-section="${sec.section}"]`).getAttribute('data-share')).toBe(String(expected));
    }
    expect(await fig.locator('g.wb-ecdf-mark line').count()).toBe(1);
  });

  it('letter distribution: one bar per section and letter, with the count of the engine’s letters', async () => {
    const letters = new Set(project.plan.scale.cutoffs.map((c) => c.letter));
    expect(await app.page.locator('figure[data-chart="letters"] g.wb-letter-bar rect').count()).toBe(letters.size * stats().sections.length);
    // Counted here straight from gradeCourse's letters, one student at a time.
    const expected = new Map<string, number>();
    project.gradebook.students.forEach((s, i) => {
      const letter = results[i]!.letter;
      if (letter !== null) expected.set(`${s.section}, ${letter}`, (expected.get(`${s.section}, ${letter}`) ?? 0) + 1);
    });
    const titles = await app.page.locator('figure[data-chart="letters"] g.wb-letter-bar rect title').allTextContents();
    for (const t of titles) {
      const m = /^(.*): (\d+) \(/.exec(t);
      expect(m, t).not.toBeNull();
      expect(Number(m![2]), t).toBe(expected.get(m![1]!) ?? 0);
    }
  });

  it('comparison and item analysis show the engine’s words and numbers', async () => {
    const s = stats();
    // Their "computing" live regions are polite and empty once the numbers are shown.
    for (const id of ['comparison-status', 'item-analysis-status']) {
      const status = app.page.getByTestId(id);
      expect(await status.getAttribute('role')).toBe('status');
      expect((await status.textContent())?.trim()).toBe('');
    }
    const c = compareSections(s.sections.map((x) => ({ section: x.section, values: x.values })));
    const panel = app.page.getByTestId('comparison');
    for (const sentence of c.sentences) expect(await panel.getByText(sentence, { exact: true }).count()).toBe(1);
    expect(await panel.getByText(c.caution, { exact: true }).count()).toBe(1);
    // The pairwise sentences are built when their toggle opens.
    const inWords = panel.locator('details').filter({ hasText: 'The same, in sentences' });
    await inWords.locator('summary').click();
    await expect.poll(() => inWords.locator('li').count()).toBe(c.pairs.length);
    expect(await inWords.locator('li').allTextContents()).toEqual(c.pairs.map((p) => p.sentence));
    await inWords.locator('summary').click();
    const items = itemAnalysis(project.gradebook, project.plan);
    const rows = await app.page.locator('[data-testid="item-analysis"] tbody tr').evaluateAll((trs) =>
      trs.map((tr) => ({ id: tr.getAttribute('data-assessment'), flags: tr.getAttribute('data-flags'), r: tr.querySelector('td[data-value]')?.getAttribute('data-value') ?? null })),
    );
    expect(rows).toEqual(items.map((i) => ({ id: i.assessmentId, flags: i.flags.map((f) => f.code).join(' '), r: i.discrimination.defined ? String(i.discrimination.value) : null })));
  });

  it('statistics on one assessment: item percents of earned scores, left-out cells counted', async () => {
    const a = project.gradebook.assessments[0]!;
    await app.page.getByTestId('measure').selectOption(`asm:${a.id}`);
    const expected = sectionStatistics(project.gradebook, results, { measure: { kind: 'assessment', assessmentId: a.id } });
    await expect.poll(async () => (await tableCells(app.page)).get(`n|${COURSE}`)?.value).toBe(String(expected.course.n));
    const cells = await tableCells(app.page);
    const mean = expected.course.mean;
    if (!mean.defined) throw new Error('mean not defined');
    expect(Number(cells.get(`mean|${COURSE}`)?.value)).toBe(mean.value);
    await app.page.getByTestId('measure').selectOption('final');
  });

  it('light mode: no axe violations with every text alternative open; no CSP or console errors; screenshot', async () => {
    const { page } = app;
    await page.getByTestId('comparison').waitFor();
    await openEveryToggle(page);
    const results = await runAxe(page);
    expect(describeViolations(results)).toEqual([]);
    expect(app.pageErrors).toEqual([]);
    for (const summary of await page.locator('.wb-sections details > summary').all()) await summary.click();
    await screenshot(page, 'sections-light');
  });
});

/** Opens every toggle of the workspace and waits until each chart's table has been built. */
async function openEveryToggle(page: AppSession['page']): Promise<void> {
  for (const summary of await page.locator('.wb-sections details > summary').all()) await summary.click();
  const charts = await page.locator('.wb-chart-table').count();
  await expect.poll(() => page.locator('.wb-chart-table table').count()).toBe(charts);
}

describe('Sections workspace in dark mode (browser)', () => {
  let app: AppSession;
  beforeAll(async () => {
    app = await openApp({ colorScheme: 'dark' });
    await showSections(app.page);
  });
  afterAll(async () => {
    await app?.close();
  });

  it('no axe violations (colour contrast included) and a screenshot', async () => {
    const { page } = app;
    await openEveryToggle(page);
    expect(describeViolations(await runAxe(page))).toEqual([]);
    for (const summary of await page.locator('.wb-sections details > summary').all()) await summary.click();
    await screenshot(page, 'sections-dark');
    expect(app.pageErrors).toEqual([]);
  });
});
