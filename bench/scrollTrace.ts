/**
 * Profiling aid (not part of `npm run bench`): opens the built renderer with a synthetic course the
 * way bench/renderer.ts does (saveProject, then Open… and the path dialog), goes to the Roster and
 * only scrolls the grid — mouse-wheel steps of 680 px, one painted frame per step, first row to
 * last — while recording a Chromium trace over CDP (`Tracing`), or a CPU profile (`Profiler`).
 *
 *   npx tsx bench/scrollTrace.ts [--students 1000] [--profile | --heap] [--out /tmp/scroll] [--renderer DIR]
 *     [--edit] [--start FRACTION] [--steps N]
 *
 * --renderer serves another build of the renderer (e.g. `vite build … --outDir /tmp/before`), to
 * compare two builds run after run on this noisy machine; default dist/renderer through openApp.
 *
 * Prints: long tasks (> 50 ms, PerformanceObserver 'longtask') during the scroll; main-thread
 * self time by trace event (script, style, layout, paint, GC…), over the whole scroll and inside
 * the long tasks only; with --profile, the JavaScript functions with the most self time.
 * Writes <out>.trace.json (open in the DevTools Performance panel) and <out>.cpuprofile.
 * For readable function names build the renderer unminified first:
 *   npx vite build --config renderer/vite.config.mts --minify false
 */
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type CDPSession, type Page } from 'playwright-core';
import { startHarness } from '../main/harness/server';
import { saveProject } from '../main/services/project';
import { answerPathDialog, openApp, waitForCourse } from '../tests/e2e/harness';
import { syntheticCourse } from './generate';

const WHEEL_PX = 680;
const arg = (name: string): string | undefined => ((i) => (i >= 0 ? process.argv[i + 1] : undefined))(process.argv.indexOf(name));
const students = Number(arg('--students') ?? '1000');
const profile = process.argv.includes('--profile');
/** Sample allocations (CDP HeapProfiler.startSampling) instead of tracing. */
const heap = process.argv.includes('--heap');
const out = arg('--out') ?? join(tmpdir(), `scroll-${students}`);
const rendererDir = arg('--renderer');
/** Before scrolling, edit the first category's weight in Plan and show Sections, as bench/renderer.ts does. */
const editFirst = process.argv.includes('--edit');
/** Start at this fraction of the grid's height (default 0: the first row). */
const startAt = Number(arg('--start') ?? '0');
/** Stop after this many wheel steps (default: at the last row). */
const maxSteps = Number(arg('--steps') ?? 'Infinity');

/** openApp (tests/e2e/harness.ts) with another renderer folder; same Chromium flags and viewport. */
async function openBuild(dir: string): Promise<{ page: Page; close(): Promise<void> }> {
  const temp = await mkdtemp(join(tmpdir(), 'weighbridge-scroll-app-'));
  await mkdir(join(temp, 'user-data'));
  const harness = await startHarness({ userDataDir: join(temp, 'user-data'), rendererDir: dir });
  const context = await chromium.launchPersistentContext(join(temp, 'profile'), {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    colorScheme: 'light',
    viewport: { width: 1280, height: 820 },
    env: { ...process.env, XDG_CONFIG_HOME: join(temp, 'xdg-config'), XDG_CACHE_HOME: join(temp, 'xdg-cache') },
  });
  const page = context.pages()[0] ?? (await context.newPage());
  await page.goto(harness.url);
  await waitForCourse(page);
  return {
    page,
    async close() {
      await context.close();
      await harness.close();
      await rm(temp, { recursive: true, force: true });
    },
  };
}

interface TraceEvent {
  readonly name: string;
  readonly ph: string;
  readonly ts: number;
  readonly dur?: number;
  /** Thread (CPU) time, less disturbed than `dur` by other processes on a loaded machine. */
  readonly tdur?: number;
  readonly pid: number;
  readonly tid: number;
  readonly args?: { readonly name?: string };
}

const PROBE = String.raw`(() => {
  window.__scroll = { longTasks: [] };
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) window.__scroll.longTasks.push({ start: e.startTime, duration: e.duration });
  }).observe({ type: 'longtask', buffered: true });
  window.__afterPaint = () => new Promise((resolve) => requestAnimationFrame(() => {
    const ch = new MessageChannel();
    ch.port1.onmessage = () => resolve(performance.now());
    ch.port2.postMessage(null);
  }));
})()`;

async function collectTrace(cdp: CDPSession): Promise<TraceEvent[]> {
  const events: TraceEvent[] = [];
  cdp.on('Tracing.dataCollected', (e) => void events.push(...(e.value as unknown as TraceEvent[])));
  const done = new Promise<void>((resolve) => cdp.once('Tracing.tracingComplete', () => resolve()));
  await cdp.send('Tracing.end');
  await done;
  return events;
}

/** Self (exclusive) time per event name on one thread, from complete ('X') events. */
function selfTimes(events: readonly TraceEvent[], within?: (e: TraceEvent) => boolean, cpu = false): Map<string, number> {
  const len = (e: TraceEvent) => (cpu ? e.tdur ?? 0 : e.dur!);
  const xs = events.filter((e) => e.ph === 'X' && e.dur !== undefined).sort((a, b) => a.ts - b.ts || (b.dur ?? 0) - (a.dur ?? 0));
  const self = new Map<string, number>();
  const stack: { e: TraceEvent; end: number; child: number }[] = [];
  const pop = () => {
    const top = stack.pop()!;
    if (within === undefined || within(top.e)) self.set(top.e.name, (self.get(top.e.name) ?? 0) + (len(top.e) - top.child));
    const parent = stack[stack.length - 1];
    if (parent !== undefined) parent.child += len(top.e);
  };
  for (const e of xs) {
    while (stack.length > 0 && stack[stack.length - 1]!.end <= e.ts) pop();
    stack.push({ e, end: e.ts + e.dur!, child: 0 });
  }
  while (stack.length > 0) pop();
  return self;
}

function table(m: ReadonlyMap<string, number>, limit = 18): string {
  const total = [...m.values()].reduce((a, b) => a + b, 0);
  return [...m.entries()].sort((a, b) => b[1] - a[1]).slice(0, limit)
    .map(([k, v]) => `  ${(v / 1000).toFixed(1).padStart(9)} ms ${((100 * v) / total).toFixed(1).padStart(5)} %  ${k}`).join('\n');
}

interface ProfileNode {
  readonly id: number;
  readonly callFrame: { readonly functionName: string; readonly url: string; readonly lineNumber: number; readonly columnNumber: number };
}
interface CpuProfile {
  readonly nodes: readonly ProfileNode[];
  readonly samples: readonly number[];
  readonly timeDeltas: readonly number[];
}

function profileTable(p: CpuProfile, limit = 30): string {
  const byId = new Map(p.nodes.map((n) => [n.id, n]));
  const self = new Map<string, number>();
  p.samples.forEach((id, i) => {
    const n = byId.get(id);
    if (n === undefined) return;
    const f = n.callFrame;
    const key = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop() ?? ''}:${f.lineNumber + 1}:${f.columnNumber + 1}`;
    self.set(key, (self.get(key) ?? 0) + (p.timeDeltas[i] ?? 0));
  });
  return table(self, limit);
}

interface HeapNode {
  readonly callFrame: ProfileNode['callFrame'];
  readonly selfSize: number;
  readonly children: readonly HeapNode[];
}
interface SamplingHeapProfile {
  readonly head: HeapNode;
}

function heapTable(p: SamplingHeapProfile, limit = 25): string {
  const self = new Map<string, number>();
  const walk = (n: HeapNode, parent: string) => {
    const f = n.callFrame;
    const name = f.functionName || '(anonymous)';
    // Allocation by a built-in (an array literal, a Map) is charged to the script that called it.
    const key = f.url === '' && parent !== '' ? `${parent} > ${name}` : `${name} ${f.url.split('/').pop() ?? ''}:${f.lineNumber + 1}:${f.columnNumber + 1}`;
    self.set(key, (self.get(key) ?? 0) + n.selfSize);
    for (const c of n.children) walk(c, f.url === '' ? parent : key);
  };
  walk(p.head, '');
  const total = [...self.values()].reduce((a, b) => a + b, 0);
  return [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, limit)
    .map(([k, v]) => `  ${(v / 2 ** 20).toFixed(1).padStart(8)} MiB ${((100 * v) / total).toFixed(1).padStart(5)} %  ${k}`).join('\n');
}

async function main(): Promise<void> {
  const { book, plan } = syntheticCourse({ students, assessments: 60, sections: 40, seed: 10 });
  const title = `Bench course, ${students} students`;
  const dir = await mkdtemp(join(tmpdir(), 'weighbridge-scroll-trace-'));
  const session = rendererDir === undefined ? await openApp({ colorScheme: 'light' }) : await openBuild(rendererDir);
  try {
    const path = join(dir, 'bench.weighbridge');
    const saved = await saveProject(path, { title, gradebook: book, plan, source: null, notes: '' });
    if (!saved.ok) throw new Error(saved.message);
    const { page } = session;
    await page.getByRole('button', { name: 'Open…' }).click();
    await answerPathDialog(page, path);
    await page.getByText(title).first().waitFor({ timeout: 120_000 });
    await page.evaluate(PROBE);
    if (editFirst) {
      const category = plan.categories[0];
      if (category === undefined) throw new Error('the plan has no category');
      await page.keyboard.press('Control+3');
      const field = page.getByRole('textbox', { name: `Weight of ${category.name}`, exact: true });
      await field.fill(String(category.weight + 5));
      await field.press('Enter');
      await page.keyboard.press('Control+5');
      await page.locator('[data-testid="section-statistics"]').waitFor({ timeout: 600_000 });
      await page.evaluate('window.__afterPaint()');
    }
    await page.keyboard.press('Control+2');
    await page.getByRole('grid', { name: /Scores/ }).waitFor({ timeout: 60_000 });
    const el = "document.querySelector('.wb-roster-scroll')";
    const box = await page.locator('.wb-roster-scroll').boundingBox();
    if (box === null) throw new Error('no grid on screen');
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.evaluate(`{ const el = ${el}; el.scrollTop = Math.round(${startAt} * (el.scrollHeight - el.clientHeight)); }`);
    await page.evaluate('window.__afterPaint().then(() => window.__afterPaint())');

    const cdp = await page.context().newCDPSession(page);
    let heapBefore = 0;
    if (heap) {
      await cdp.send('HeapProfiler.enable');
      await cdp.send('HeapProfiler.collectGarbage');
      heapBefore = ((await cdp.send('Runtime.getHeapUsage')) as { usedSize: number }).usedSize;
      await cdp.send('HeapProfiler.startSampling', { samplingInterval: 16384, includeObjectsCollectedByMajorGC: true, includeObjectsCollectedByMinorGC: true });
    } else if (profile) {
      await cdp.send('Profiler.enable');
      await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
      await cdp.send('Profiler.start');
    } else {
      await cdp.send('Tracing.start', {
        categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8', 'disabled-by-default-v8.gc', 'blink.user_timing', 'toplevel'].join(','),
        transferMode: 'ReportEvents',
      });
    }
    const from = (await page.evaluate('performance.now()')) as number;
    let steps = 0;
    for (;;) {
      await page.mouse.wheel(0, WHEEL_PX);
      steps++;
      const at = (await page.evaluate(`window.__afterPaint().then(() => { const el = ${el}; return { top: el.scrollTop, max: el.scrollHeight - el.clientHeight }; })`)) as { top: number; max: number };
      if (at.top >= at.max - 1 || steps > 4 * students || steps >= maxSteps) break;
    }
    const to = (await page.evaluate('window.__afterPaint()')) as number;
    const long = ((await page.evaluate('window.__scroll.longTasks')) as { start: number; duration: number }[]).filter((t) => t.start >= from && t.start <= to);
    console.log(`${students} students: ${steps} wheel steps in ${(to - from).toFixed(0)} ms; ${long.length} long tasks > 50 ms (longest ${Math.max(0, ...long.map((t) => t.duration)).toFixed(0)} ms)`);

    if (heap) {
      const { profile: h } = (await cdp.send('HeapProfiler.stopSampling')) as unknown as { profile: SamplingHeapProfile };
      const heapAfter = ((await cdp.send('Runtime.getHeapUsage')) as { usedSize: number }).usedSize;
      await cdp.send('HeapProfiler.collectGarbage');
      const heapAfterGc = ((await cdp.send('Runtime.getHeapUsage')) as { usedSize: number }).usedSize;
      await writeFile(`${out}.heapprofile`, JSON.stringify(h));
      const mib = (b: number) => `${(b / 2 ** 20).toFixed(1)} MiB`;
      console.log(`JS heap used: ${mib(heapBefore)} before (after a GC), ${mib(heapAfter)} at the end, ${mib(heapAfterGc)} after a GC (retained by the scroll: ${mib(heapAfterGc - heapBefore)})`);
      console.log(`allocated during the scroll (sampled, self size by function), ${out}.heapprofile:\n${heapTable(h)}`);
    } else if (profile) {
      const { profile: p } = (await cdp.send('Profiler.stop')) as unknown as { profile: CpuProfile };
      await writeFile(`${out}.cpuprofile`, JSON.stringify(p));
      console.log(`JavaScript self time (top functions), ${out}.cpuprofile:\n${profileTable(p)}`);
    } else {
      const events = await collectTrace(cdp);
      await writeFile(`${out}.trace.json`, JSON.stringify({ traceEvents: events }));
      const mainThread = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain');
      if (mainThread === undefined) throw new Error('no CrRendererMain thread in the trace');
      const onMain = events.filter((e) => e.pid === mainThread.pid && e.tid === mainThread.tid);
      const tasks = onMain.filter((e) => e.ph === 'X' && (e.name === 'RunTask' || e.name === 'ThreadControllerImpl::RunTask'));
      const longTasks = tasks.filter((t) => (t.dur ?? 0) > 50_000);
      const tops = tasks.filter((t) => t.name === 'ThreadControllerImpl::RunTask').map((t) => t.dur! / 1000).sort((a, b) => a - b);
      const q = (f: number) => tops[Math.min(tops.length - 1, Math.floor(f * tops.length))]!.toFixed(1);
      const busy = tops.reduce((a, b) => a + b, 0);
      const cpu = tasks.filter((t) => t.name === 'ThreadControllerImpl::RunTask').reduce((a, t) => a + (t.tdur ?? 0) / 1000, 0);
      console.log(`trace: ${tops.length} main-thread tasks, ${tops.filter((d) => d > 50).length} over 50 ms, ${tops.filter((d) => d > 16).length} over 16 ms; busy ${(busy / steps).toFixed(1)} ms (CPU ${(cpu / steps).toFixed(1)} ms) per wheel step; task ms p99 ${q(0.99)}, longest ${q(1)}; ${out}.trace.json`);
      const medianCpu = (name: string) => {
        const xs = onMain.filter((e) => e.ph === 'X' && e.name === name && (e.dur ?? 0) > 500).map((e) => (e.tdur ?? 0) / 1000).sort((a, b) => a - b);
        return xs.length === 0 ? 'none' : `${xs[xs.length >> 1]!.toFixed(2)} ms CPU (median of ${xs.length})`;
      };
      console.log(`style recalc ${medianCpu('UpdateLayoutTree')}; layout ${medianCpu('Layout')}; paint ${medianCpu('Paint')}`);
      console.log(`main-thread self time over the scroll:\n${table(selfTimes(onMain))}`);
      console.log(`main-thread self CPU time over the scroll, per wheel step:\n${table(new Map([...selfTimes(onMain, undefined, true)].map(([k, v]) => [k, v / steps])))}`);
      const inLong = (e: TraceEvent) => longTasks.some((t) => e.ts >= t.ts && e.ts < t.ts + t.dur!);
      console.log(`main-thread self time inside the long tasks:\n${table(selfTimes(onMain, inLong))}`);
      // Each long task on its own: wall and CPU time, and what inside it took the most self time.
      const t0 = tasks[0]?.ts ?? 0;
      for (const t of longTasks.filter((x) => x.name === 'ThreadControllerImpl::RunTask')) {
        const inside = onMain.filter((e) => e.ts >= t.ts && e.ts < t.ts + t.dur!);
        const top = [...selfTimes(inside)].sort((a, b) => b[1] - a[1]).slice(0, 6).map(([k, v]) => `${k} ${(v / 1000).toFixed(1)}`).join(', ');
        console.log(`long task at +${((t.ts - t0) / 1000).toFixed(0)} ms: wall ${(t.dur! / 1000).toFixed(1)} ms, CPU ${((t.tdur ?? 0) / 1000).toFixed(1)} ms: ${top}`);
      }
      const gcs = onMain.filter((e) => e.ph === 'X' && /MajorGC|MinorGC|V8\.GC_MC_|V8\.GCFinalizeMC|V8\.GCScavenger$|V8\.GC_MARK_COMPACTOR$|V8\.GC_SCAVENGER$|V8\.GCIncrementalMarking$/.test(e.name));
      const byName = new Map<string, { n: number; ms: number; max: number }>();
      for (const g of gcs) {
        const v = byName.get(g.name) ?? { n: 0, ms: 0, max: 0 };
        byName.set(g.name, { n: v.n + 1, ms: v.ms + g.dur! / 1000, max: Math.max(v.max, g.dur! / 1000) });
      }
      console.log(`GC events on the main thread: ${[...byName].map(([k, v]) => `${k} ×${v.n} ${v.ms.toFixed(0)} ms (longest ${v.max.toFixed(1)})`).join('; ') || 'none'}`);
    }
  } finally {
    await session.close();
    await rm(dir, { recursive: true, force: true });
  }
}

await main();
