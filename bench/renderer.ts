/**
 * The renderer workload of `npm run bench`: the built renderer (dist/renderer) in Debian's
 * headless Chromium over the real services (tests/e2e/harness.ts `openApp`), with a seeded
 * synthetic course of 10 000 students (1 000 with --quick) opened as a user would: saved as a
 * project file, then Open… and the path dialog.
 *
 * Weight edit → statistics painted (one run):
 *   1. Plan: type a new weight into "Weight of <first category>" and press Enter. Start = the
 *      Enter keydown's event timestamp. End = the first frame painted (requestAnimationFrame, then
 *      a MessageChannel task, which runs once that frame has been produced) after which the
 *      weight-sum cell shows the new sum. The store regrades the whole course inside this step.
 *   2. Ctrl+5 to Sections. Start = that keydown's timestamp; end = the first frame painted after
 *      which the course-mean cell of the statistics table holds the engine's mean for the new
 *      weights (computed here in Node with gradeCourse + sectionStatistics). The statistics
 *      table and every chart that is on screen are drawn in that frame — checked there: a chart
 *      on screen without its SVG for the new numbers is a wrong result. At 1280 × 820 the four
 *      charts lie below the table (`sectionsChartsOnScreenAtPaint`), so the app draws them just
 *      after that paint, one per slice; the comparison of sections and the item analysis are
 *      computed after that paint, in slices, and shown when done.
 *   weightEditToPaintMs = (1) + (2): the app's own time from the edit to the statistics and
 *   charts on screen, leaving out the harness's round trip between the two key presses.
 *   sectionsCompleteAfterEditMs: from the same Ctrl+5 keydown to the first frame painted with the
 *   four charts drawn and the comparison and the item analysis on screen too (what the deferred
 *   work costs in all); the long tasks in that stretch after the paint are counted apart
 *   (`sectionsCompleteLongTasksOver50ms`).
 *   In the same run, alternating with it: (2) alone without an edit (`sectionsOnlyMs`: what
 *   showing the statistics costs anyway), and the same sequence on the 212-student demo course
 *   (`baselineMs`, `ratio`).
 *
 * Grid scroll: Roster, mouse-wheel steps of WHEEL_PX over the grid, one painted frame per step,
 * from the first row to the last; long tasks (> 50 ms, the Long Tasks API's own threshold) from a
 * PerformanceObserver({ type: 'longtask', buffered: true }) whose start falls inside the scroll.
 *
 * Page-side code is passed to Chromium as plain JavaScript strings, not functions: tsx's
 * transform may add helpers (name-keeping) that do not exist in the page.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import type { CourseProject } from '../renderer/bridge/contract';
import type { Gradebook, GradingPlan } from '../renderer/engine/model';
import { gradeCourse } from '../renderer/engine/grading';
import { sectionStatistics } from '../renderer/engine/analysis/sectionStatistics';
import { snap15 } from '../renderer/engine/grading/rounding';
import { nominalWeightSum } from '../renderer/state/planEdits';
import { formatShare } from '../renderer/ui/results/resultsAccess';
import { loadDemoCourse } from '../main/services/demo';
import { saveProject } from '../main/services/project';
import { answerPathDialog, openApp, type AppSession } from '../tests/e2e/harness';
import { syntheticCourse } from './generate';

const WHEEL_PX = 680; // 20 rows of 34 px per wheel step: a brisk fling, not a single notch
const ROW_HEIGHT = 34; // renderer/ui/roster/RosterRow.tsx

export interface RendererOptions {
  readonly students: number;
  readonly editRuns: number;
  readonly scrollRuns: number;
  readonly warmUpLarge: boolean;
  readonly log: (text: string) => void;
  /** Wrong results (the screen disagreeing with the engine) are pushed here. */
  readonly wrong: string[];
}

interface Timing {
  readonly start: number;
  readonly end: number;
  readonly applied: number | null;
  readonly frames: number;
  /** Charts on screen in the end frame, and how many of them were not drawn for the new numbers. */
  readonly charts: { readonly onScreen: number; readonly undrawn: number };
}

interface LongTask {
  readonly start: number;
  readonly duration: number;
}

/** Installed once per page; see the file comment for the definitions. */
const PROBE = String.raw`(() => {
  if (window.__wbBench) return window.__wbBench.longTaskSupported;
  const afterPaint = () => new Promise((resolve) => requestAnimationFrame(() => {
    const ch = new MessageChannel();
    ch.port1.onmessage = () => resolve(performance.now());
    ch.port2.postMessage(null);
  }));
  const longTasks = [];
  const longTaskSupported = PerformanceObserver.supportedEntryTypes.includes('longtask');
  if (longTaskSupported) {
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) longTasks.push({ start: e.startTime, duration: e.duration });
    }).observe({ type: 'longtask', buffered: true });
  }
  // Charts on screen in a frame, and of those how many are not (yet) drawn for the current inputs:
  // the Sections panel of charts counts as one undrawn chart while its figures are not built.
  const inView = (el) => { const r = el.getBoundingClientRect(); return r.bottom >= 0 && r.top <= innerHeight && r.right >= 0 && r.left <= innerWidth; };
  const chartsOnScreen = () => {
    const hosts = [...document.querySelectorAll('.wb-chart-host')].filter(inView);
    const panel = document.querySelector('section[aria-label="Distribution charts"]');
    const unbuilt = panel !== null && inView(panel) && panel.querySelector('.wb-charts') === null ? 1 : 0;
    return { onScreen: hosts.length, undrawn: hosts.filter((h) => h.getAttribute('data-drawn') !== 'true').length + unbuilt };
  };
  const matches = (c) => {
    const el = document.querySelector(c.selector);
    if (el === null) return false;
    return c.attribute === null ? (el.textContent || '').trim() === c.value : el.getAttribute(c.attribute) === c.value;
  };
  window.__wbBench = {
    longTaskSupported,
    longTasks,
    afterPaint,
    pending: null,
    arm(key, check) {
      window.__wbBench.pending = new Promise((resolve, reject) => {
        const onKey = (e) => {
          if (e.key !== key) return;
          window.removeEventListener('keydown', onKey, true);
          const start = e.timeStamp;
          const marksBefore = performance.getEntriesByName('wb:edit-applied').length;
          const deadline = performance.now() + 900000;
          let frames = 0;
          const loop = async () => {
            for (;;) {
              const t = await afterPaint();
              frames++;
              if (matches(check)) {
                const marks = performance.getEntriesByName('wb:edit-applied');
                const applied = marks.length > marksBefore ? marks[marks.length - 1].startTime : null;
                resolve({ start, end: t, applied, frames, charts: chartsOnScreen() });
                return;
              }
              if (t > deadline) {
                const el = document.querySelector(check.selector);
                reject(new Error('the screen never showed ' + check.value + ' at ' + check.selector + ' (it shows ' +
                  (el === null ? 'nothing' : check.attribute === null ? el.textContent : el.getAttribute(check.attribute)) + ')'));
                return;
              }
            }
          };
          void loop();
        };
        window.addEventListener('keydown', onKey, true);
      });
    },
  };
  return longTaskSupported;
})()`;

interface Check {
  readonly selector: string;
  readonly attribute: string | null;
  readonly value: string;
}

const js = (value: unknown): string => JSON.stringify(value);

async function arm(page: Page, key: string, check: Check): Promise<void> {
  await page.evaluate(`window.__wbBench.arm(${js(key)}, ${js(check)})`);
}

async function settle(page: Page): Promise<Timing> {
  return (await page.evaluate('window.__wbBench.pending')) as Timing;
}

/** The first painted frame with the comparison, the item analysis and all four charts drawn (performance.now()). */
const SECTIONS_COMPLETE = String.raw`(async () => {
  for (;;) {
    const t = await window.__wbBench.afterPaint();
    if (document.querySelector('[data-testid="comparison"]') !== null && document.querySelector('[data-testid="item-analysis"]') !== null &&
      document.querySelectorAll('.wb-chart-host[data-drawn="true"]').length === 4) return t;
  }
})()`;

async function longTasksBetween(page: Page, from: number, to: number): Promise<LongTask[]> {
  const all = (await page.evaluate('window.__wbBench.longTasks')) as LongTask[];
  return all.filter((t) => t.start >= from && t.start <= to);
}

function withWeight(plan: GradingPlan, index: number, weight: number): GradingPlan {
  return { ...plan, categories: plan.categories.map((c, i) => (i === index ? { ...c, weight } : c)) };
}

/** What the screen must show once the plan `plan` is in effect (engine values, never typed in). */
function expectations(book: Gradebook, plan: GradingPlan): { planCheck: Check; sectionsCheck: Check } {
  const stats = sectionStatistics(book, gradeCourse(book, plan).students, { quantileType: 7, measure: { kind: 'final' } });
  if (!stats.course.mean.defined) throw new Error('bench course has no defined mean');
  return {
    planCheck: { selector: '[data-testid="weight-sum"]', attribute: null, value: formatShare(snap15(nominalWeightSum(plan))) },
    sectionsCheck: { selector: '[data-testid="section-statistics"] td[data-stat="mean"][data-section="__course__"]', attribute: 'data-value', value: String(stats.course.mean.value) },
  };
}

/** One course open in one browser session, ready to edit its first category's weight. */
interface Subject {
  readonly label: string;
  readonly session: AppSession;
  readonly project: CourseProject;
  readonly weights: readonly [number, number];
  readonly expect: ReadonlyMap<number, ReturnType<typeof expectations>>;
  current: number;
}

function subject(label: string, session: AppSession, project: CourseProject): Subject {
  const first = project.plan.categories[0];
  if (first === undefined) throw new Error(`${label}: the plan has no category`);
  const weights: [number, number] = [first.weight + 5, first.weight];
  const expect = new Map(weights.map((w) => [w, expectations(project.gradebook, withWeight(project.plan, 0, w))] as const));
  return { label, session, project, weights, expect, current: first.weight };
}

function weightField(s: Subject) {
  return s.session.page.getByRole('textbox', { name: `Weight of ${s.project.plan.categories[0]!.name}`, exact: true });
}

async function showPlan(s: Subject): Promise<void> {
  const { page } = s.session;
  await page.keyboard.press('Control+3');
  await weightField(s).waitFor({ timeout: 60_000 });
  await page.evaluate('window.__wbBench.afterPaint()');
}

/** (2) alone: Plan → Sections without an edit. */
async function sectionsOnly(s: Subject): Promise<{ ms: number; charts: Timing['charts'] }> {
  await showPlan(s);
  const { page } = s.session;
  await arm(page, '5', s.expect.get(s.current)!.sectionsCheck);
  await page.keyboard.press('Control+5');
  const t = await settle(page);
  return { ms: t.end - t.start, charts: t.charts };
}

/** (1) + (2): one weight edit in Plan, then Sections. */
async function editToPaint(s: Subject): Promise<{
  total: number; plan: number; sections: number; sectionsComplete: number; appliedToPaint: number | null; longTasks: LongTask[];
  charts: Timing['charts']; longTasksToComplete: LongTask[];
}> {
  await showPlan(s);
  const { page } = s.session;
  const next = s.weights[0] === s.current ? s.weights[1] : s.weights[0];
  const want = s.expect.get(next)!;
  const input = weightField(s);
  await input.fill(String(next));
  await arm(page, 'Enter', want.planCheck);
  await input.press('Enter');
  const p = await settle(page);
  s.current = next;
  await arm(page, '5', want.sectionsCheck);
  await page.keyboard.press('Control+5');
  const q = await settle(page);
  const complete = (await page.evaluate(SECTIONS_COMPLETE)) as number;
  return {
    total: p.end - p.start + (q.end - q.start),
    plan: p.end - p.start,
    sections: q.end - q.start,
    sectionsComplete: complete - q.start,
    appliedToPaint: p.applied === null ? null : p.end - p.applied,
    longTasks: await longTasksBetween(page, p.start, q.end),
    charts: q.charts,
    // After the paint: the charts below the screen, the comparison and the item analysis.
    longTasksToComplete: await longTasksBetween(page, q.end, q.start + (complete - q.start)),
  };
}

/** Wheel through the whole Roster grid; long tasks that started during the scroll. */
async function scrollGrid(session: AppSession, students: number, wrong: string[]): Promise<{ ms: number; steps: number; longTasks: LongTask[] }> {
  const { page } = session;
  await page.keyboard.press('Control+2');
  const grid = page.getByRole('grid', { name: /Scores/ });
  await grid.waitFor({ timeout: 60_000 });
  const rowcount = await grid.getAttribute('aria-rowcount');
  if (rowcount !== String(students + 1)) wrong.push(`renderer: the Roster grid has aria-rowcount ${rowcount}, expected ${students + 1}`);
  const scroller = page.locator('.wb-roster-scroll');
  const el = "document.querySelector('.wb-roster-scroll')";
  await page.evaluate(`${el}.scrollTop = 0`);
  const box = await scroller.boundingBox();
  if (box === null) throw new Error('the Roster grid is not on screen');
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.evaluate('window.__wbBench.afterPaint().then(() => window.__wbBench.afterPaint())');
  const from = (await page.evaluate('performance.now()')) as number;
  const cap = Math.ceil((students * ROW_HEIGHT) / WHEEL_PX) * 4 + 50;
  let steps = 0;
  for (;;) {
    await page.mouse.wheel(0, WHEEL_PX);
    steps++;
    const at = (await page.evaluate(`window.__wbBench.afterPaint().then(() => { const el = ${el}; return { top: el.scrollTop, max: el.scrollHeight - el.clientHeight }; })`)) as { top: number; max: number };
    if (at.top >= at.max - 1) break;
    if (steps >= cap) {
      wrong.push(`renderer: the grid did not reach its last row after ${steps} wheel steps (scrollTop ${at.top} of ${at.max})`);
      break;
    }
  }
  const to = (await page.evaluate('window.__wbBench.afterPaint()')) as number;
  const lastRow = await page.locator(`[data-cell="${students - 1}:0"]`).count();
  if (lastRow !== 1) wrong.push('renderer: after scrolling to the end the last student’s row is not in the grid');
  return { ms: to - from, steps, longTasks: await longTasksBetween(page, from, to) };
}

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
const round = (x: number, d = 2): number => Math.round(x * 10 ** d) / 10 ** d;

async function openProjectFile(session: AppSession, path: string, title: string): Promise<void> {
  const { page } = session;
  await page.getByRole('button', { name: 'Open…' }).click();
  await answerPathDialog(page, path);
  await page.getByText(title).first().waitFor({ timeout: 120_000 });
}

export async function rendererWorkload(opts: RendererOptions) {
  const { students, log, wrong } = opts;
  const demoLoaded = await loadDemoCourse();
  if (!demoLoaded.ok) throw new Error(demoLoaded.message);
  const demo = demoLoaded.value;
  // Same generator and seed as weightEdit10k, so the two figures describe the same course.
  const { book, plan } = syntheticCourse({ students, assessments: 60, sections: 40, seed: 10 });
  const title = `Bench course, ${students} students`;
  const big: CourseProject = { title, gradebook: book, plan, source: null, notes: '' };
  const dir = await mkdtemp(join(tmpdir(), 'weighbridge-bench-renderer-'));
  const sessions: AppSession[] = [];
  try {
    const path = join(dir, 'bench.weighbridge');
    const saved = await saveProject(path, big);
    if (!saved.ok) throw new Error(`saving the bench course failed: ${saved.message}`);
    log(`renderer: opening the ${students}-student course in Chromium`);
    const bigSession = await openApp({ colorScheme: 'light' });
    sessions.push(bigSession);
    const demoSession = await openApp({ colorScheme: 'light' });
    sessions.push(demoSession);
    await openProjectFile(bigSession, path, title);
    const supported = await Promise.all(sessions.map((s) => s.page.evaluate(PROBE) as Promise<boolean>));
    const longTaskSupported = supported.every(Boolean);

    const large = subject(`${students} students`, bigSession, big);
    const small = subject('demo', demoSession, demo);
    // One unmeasured round on the demo (first-use compilation, caches); on the large course only
    // in quick mode, where a round takes seconds rather than minutes.
    if (opts.warmUpLarge) await editToPaint(large);
    await editToPaint(small);

    log('renderer: measuring weight edit → paint');
    const runs: Awaited<ReturnType<typeof editToPaint>>[] = [];
    const baseline: number[] = [];
    const onlySections: number[] = [];
    const charts: Timing['charts'][] = [];
    for (let i = 0; i < opts.editRuns; i++) {
      const run = await editToPaint(large);
      runs.push(run);
      baseline.push((await editToPaint(small)).total);
      const only = await sectionsOnly(large);
      onlySections.push(only.ms);
      charts.push(run.charts, only.charts);
    }
    // The end frame must show every chart that is on screen for the new numbers (charts below the
    // screen are drawn after it, inside sectionsCompleteAfterEditMs).
    if (charts.some((c) => c.undrawn > 0)) wrong.push(`renderer: a chart on screen was not drawn in the frame measured as painted (${JSON.stringify(charts)})`);

    log('renderer: measuring grid scroll');
    const scrolls: Awaited<ReturnType<typeof scrollGrid>>[] = [];
    for (let i = 0; i < opts.scrollRuns; i++) scrolls.push(await scrollGrid(bigSession, students, wrong));

    const errors = sessions.flatMap((s) => s.pageErrors);
    if (errors.length > 0) wrong.push(`renderer: the page reported errors: ${errors.slice(0, 3).join(' | ')}`);

    const total = median(runs.map((r) => r.total));
    const base = median(baseline);
    const scrollCounts = scrolls.map((s) => s.longTasks.length);
    const editLong = runs.map((r) => r.longTasks);
    const applied = runs.map((r) => r.appliedToPaint).filter((x): x is number => x !== null);
    if (applied.length !== runs.length) wrong.push('renderer: the wb:edit-applied mark was missing after a weight edit');
    return {
      renderer: {
        measured: longTaskSupported,
        ...(longTaskSupported ? {} : { reason: 'this Chromium does not report longtask entries' }),
        students,
        assessments: book.assessments.length,
        sections: 40,
        weightEditToPaintMs: round(total),
        baselineMs: round(base),
        ratio: round(total / base),
        baseline: `the same edit + Sections on the demo course (${demo.gradebook.students.length} students, ${demo.gradebook.assessments.length} assessments), alternating in the same run`,
        editToPlanPaintMs: round(median(runs.map((r) => r.plan))),
        sectionsAfterEditPaintMs: round(median(runs.map((r) => r.sections))),
        sectionsWithoutEditPaintMs: round(median(onlySections)),
        sectionsCompleteAfterEditMs: round(median(runs.map((r) => r.sectionsComplete))),
        sectionsChartsOnScreenAtPaint: Math.max(...charts.map((c) => c.onScreen)),
        sectionsCompleteLongTasksOver50ms: median(runs.map((r) => r.longTasksToComplete.length)),
        sectionsCompleteLongestTaskMs: round(Math.max(0, ...runs.flatMap((r) => r.longTasksToComplete.map((t) => t.duration)))),
        editAppliedToPlanPaintMs: applied.length > 0 ? round(median(applied)) : null,
        editLongTasksOver50ms: median(editLong.map((l) => l.length)),
        editLongestTaskMs: round(Math.max(0, ...editLong.flat().map((t) => t.duration))),
        editRuns: runs.length,
        longTasksOver50ms: longTaskSupported ? median(scrollCounts) : null,
        scrollLongTasksPerRun: scrollCounts,
        scrollLongestTaskMs: round(Math.max(0, ...scrolls.flatMap((s) => s.longTasks.map((t) => t.duration)))),
        scrollMs: round(median(scrolls.map((s) => s.ms))),
        scrollWheelSteps: median(scrolls.map((s) => s.steps)),
        scrollWheelPx: WHEEL_PX,
        scrollRuns: scrolls.length,
        browser: `${/(?:HeadlessChrome|Chrome)\/[\d.]+/.exec(String(await bigSession.page.evaluate('navigator.userAgent')))?.[0] ?? 'Chromium'} (/usr/bin/chromium, headless, --disable-gpu)`,
        definition: 'weightEditToPaintMs = Enter in Plan’s weight field → first frame painted with the new weight sum, plus Ctrl+5 → first frame painted with the engine’s new course mean in the Sections statistics (the table and every chart on screen in that frame; charts below the screen, the comparison and the item analysis follow, sectionsCompleteAfterEditMs); medians. longTasksOver50ms = median count of long tasks during a mouse-wheel scroll of the Roster grid from first to last row. See bench/renderer.ts.',
      },
    };
  } finally {
    for (const s of sessions) await s.close();
    await rm(dir, { recursive: true, force: true });
  }
}
