/**
 * Writes bench/LATEST.md from bench/results/latest.json (and latest-quick.json when present):
 * the figures as tables plus the standing explanation of each missed target. Run after
 * `npm run bench`:  tsx bench/latest.ts
 */
import { existsSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..');

const figure = z.record(z.string(), z.unknown());
const resultSchema = z.object({
  date: z.string(),
  mode: z.string(),
  machine: z.object({ cpus: z.number(), cpuModel: z.string(), node: z.string() }).loose(),
  targets: z.record(z.string(), z.object({ target: z.string(), value: z.number().nullable(), met: z.boolean(), reason: z.string().optional() })),
}).catchall(figure.or(z.unknown()));

type Result = z.infer<typeof resultSchema>;

function num(r: Result, workload: string, key: string): string {
  const w = r[workload];
  if (typeof w !== 'object' || w === null) return '—';
  const v = (w as Record<string, unknown>)[key];
  return typeof v === 'number' ? String(v) : v === null || v === undefined ? '—' : String(v);
}

/** A figure one level down, e.g. recompute.withoutDropLowest.ratio. */
function sub(r: Result, workload: string, part: string, key: string): string {
  const w = r[workload];
  if (typeof w !== 'object' || w === null) return '—';
  const inner = (w as Record<string, unknown>)[part];
  if (typeof inner !== 'object' || inner === null) return '—';
  const v = (inner as Record<string, unknown>)[key];
  return typeof v === 'number' ? String(v) : '—';
}

function table(r: Result): string {
  const rows: [string, string, string, string, string][] = [
    ['recompute', `${num(r, 'recompute', 'students')} × ${num(r, 'recompute', 'assessments')} × ${num(r, 'recompute', 'sections')} sections`, num(r, 'recompute', 'ms'), num(r, 'recompute', 'baselineMs'), num(r, 'recompute', 'ratio')],
    ['… of which grading only', 'same course', num(r, 'recompute', 'gradeOnlyMs'), '(floor, same run)', num(r, 'recompute', 'gradeOnlyRatio')],
    ['… of which statistics only', 'same course', num(r, 'recompute', 'statisticsOnlyMs'), '(floor, same run)', num(r, 'recompute', 'statisticsOnlyRatio')],
    ['recompute with drop-lowest off', 'same course', sub(r, 'recompute', 'withoutDropLowest', 'ms'), sub(r, 'recompute', 'withoutDropLowest', 'baselineMs'), sub(r, 'recompute', 'withoutDropLowest', 'ratio')],
    ['weightEdit10k', `${num(r, 'weightEdit10k', 'students')} students`, num(r, 'weightEdit10k', 'ms'), num(r, 'weightEdit10k', 'baselineMs'), num(r, 'weightEdit10k', 'ratio')],
    ['incremental (score edit)', `${num(r, 'incremental', 'students')} students`, num(r, 'incremental', 'ms'), `${num(r, 'incremental', 'fullMs')} (full)`, num(r, 'incremental', 'ratio')],
    ['incremental (weight edit)', `${num(r, 'incremental', 'students')} students`, num(r, 'incremental', 'weightEditMs'), `${num(r, 'incremental', 'fullMs')} (full)`, num(r, 'incremental', 'weightEditRatio')],
    ['importXlsx', `${num(r, 'importXlsx', 'rows')} × 60`, num(r, 'importXlsx', 'ms'), num(r, 'importXlsx', 'baselineMs'), num(r, 'importXlsx', 'ratio')],
    ['importCsv', `${num(r, 'importCsv', 'rows')} × 60`, num(r, 'importCsv', 'ms'), num(r, 'importCsv', 'baselineMs'), num(r, 'importCsv', 'ratio')],
    ['exportXlsx', `${num(r, 'exportXlsx', 'rows')} rows`, num(r, 'exportXlsx', 'ms'), num(r, 'exportXlsx', 'baselineMs'), num(r, 'exportXlsx', 'ratio')],
  ];
  const lines = [
    '| workload | size | ms (median) | baseline ms | ratio |',
    '|---|---|---|---|---|',
    ...rows.map((c) => `| ${c.join(' | ')} |`),
    '',
    '| CLI run | rows | seconds | rows/s | peak RSS MiB | ok |',
    '|---|---|---|---|---|---|',
    ...['cliMillion', 'streamingBenchOnly'].map(
      (k) => `| ${k === 'cliMillion' ? '`weighbridge grade` (product CLI)' : 'bench-only streaming grader'} | ${num(r, k, 'rows')} | ${num(r, k, 'seconds')} | ${num(r, k, 'rowsPerSecond')} | ${num(r, k, 'peakRssMiB')} | ${num(r, k, 'ok')} |`,
    ),
    '',
    '| renderer (Chromium) | students | weight edit → statistics painted, ms | demo course (baseline) ms | ratio | of which: Plan paint / Sections paint / Sections without edit, ms | all four charts, the comparison and the item analysis on screen, ms | long tasks > 50 ms per scroll (median; runs) | longest, ms |',
    '|---|---|---|---|---|---|---|---|---|',
    `| ${num(r, 'renderer', 'measured') === 'true' ? 'measured' : 'not measured'} | ${num(r, 'renderer', 'students')} | ${num(r, 'renderer', 'weightEditToPaintMs')} | ${num(r, 'renderer', 'baselineMs')} | ${num(r, 'renderer', 'ratio')} | ${num(r, 'renderer', 'editToPlanPaintMs')} / ${num(r, 'renderer', 'sectionsAfterEditPaintMs')} / ${num(r, 'renderer', 'sectionsWithoutEditPaintMs')} | ${num(r, 'renderer', 'sectionsCompleteAfterEditMs')} | ${num(r, 'renderer', 'longTasksOver50ms')} (${num(r, 'renderer', 'scrollLongTasksPerRun')}) | ${num(r, 'renderer', 'scrollLongestTaskMs')} |`,
    '',
    '| target | value | met | reason |',
    '|---|---|---|---|',
    ...Object.entries(r.targets).map(([k, t]) => `| ${k}: ${t.target} | ${t.value ?? '—'} | ${t.met ? 'yes' : '**no**'} | ${t.reason ?? ''} |`),
  ];
  const updates = Array.isArray(r['updates'])
    ? (r['updates'] as { date?: unknown; workloads?: unknown }[]).map((u) => `${Array.isArray(u.workloads) ? u.workloads.join(', ') : '?'} re-measured ${String(u.date)} (\`--only\`)`)
    : [];
  const note = updates.length > 0 ? ` Later: ${updates.join('; ')}.` : '';
  return `Run ${r.date} (${r.mode}) on ${r.machine.cpus} × ${r.machine.cpuModel}, Node ${r.machine.node}.${note}\n\n${lines.join('\n')}`;
}

async function load(name: string): Promise<Result | null> {
  const path = join(root, 'bench', 'results', name);
  if (!existsSync(path)) return null;
  return resultSchema.parse(JSON.parse(await readFile(path, 'utf8')));
}

async function main(): Promise<void> {
  const full = await load('latest.json');
  const quick = await load('latest-quick.json');
  const template = await readFile(join(here, 'LATEST.template.md'), 'utf8');
  const text = template
    .replace('{{FULL}}', full ? table(full) : '_No full run recorded yet._')
    .replace('{{QUICK}}', quick ? table(quick) : '_No quick run recorded yet._');
  await writeFile(join(here, 'LATEST.md'), text);
}

main().catch((e: unknown) => {
  process.stderr.write(`latest: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
});
