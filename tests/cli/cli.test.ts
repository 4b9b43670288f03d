/**
 * The command line, run for real: bundled with esbuild exactly as the build does (ESM + require
 * banner), started as a child process on the demo course and on fixtures written here. Expected
 * values come from the engine called directly (gradeCourse, sectionStatistics, describe) and, for statistics, from
 * published worked values (Hyndman & Fan 1996 via shared/REFERENCES.md; Tukey 1977 fences).
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { leftOutTotal, sectionsOf, sectionStatistics, type LeftOutCount } from '../../renderer/engine/analysis';
import type { Defined } from '../../renderer/engine/defined';
import { gradeCourse } from '../../renderer/engine/grading';
import type { Gradebook } from '../../renderer/engine/model';
import { describe as describeStats, type Summary } from '../../renderer/engine/stats';
import { loadPlanFile } from '../../main/services/project';
import { detectAndImport } from '../../main/services/spreadsheet';

const root = fileURLToPath(new URL('../../', import.meta.url));
const demoXlsx = join(root, 'demo-data', 'glaciology-231.xlsx');
const demoCsv = join(root, 'demo-data', 'glaciology-231.csv');
const demoPlan = join(root, 'demo-data', 'glaciology-231.plan.json');

let work: string;
let cli: string;

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'wb-cli-'));
  cli = join(work, 'cli.mjs');
  await build({
    entryPoints: [join(root, 'main', 'cli.ts')],
    bundle: true,
    platform: 'node',
    format: 'esm',
    outfile: cli,
    banner: { js: "import{createRequire}from'module';const require=createRequire(import.meta.url);" },
    logLevel: 'error',
  });
});

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

function run(...args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile(process.execPath, [cli, ...args], { cwd: work, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error === null ? 0 : typeof error.code === 'number' ? error.code : -1;
      resolve({ code, stdout, stderr });
    });
  });
}

async function fixture(name: string, text: string): Promise<string> {
  const path = join(work, name);
  await writeFile(path, text);
  return path;
}

interface SectionJson {
  section: string | null;
  n: number;
  withoutMark: number;
  mean: number | null;
  median: number | null;
  sd: number | null;
  populationSd: number | null;
  min: number | null;
  max: number | null;
  q1: number | null;
  q3: number | null;
  iqr: number | null;
  lowerFence: number | null;
  upperFence: number | null;
  outliers: { id: string; value: number; side: 'low' | 'high' }[];
  quantileType: number;
  quantileMethod: string;
  notes: Record<string, string>;
}

const valueOf = (d: Defined<number>): number | null => (d.defined ? d.value : null);

/** One `sections[]`/`course` object against the engine's summary of the same group (docs/cli.md fields). */
function expectSectionJson(json: SectionJson, book: Gradebook, section: string | null, s: Summary, studentIndices: readonly number[], leftOut: readonly LeftOutCount[]) {
  expect(json).toEqual({
    section,
    n: s.n,
    withoutMark: leftOutTotal(leftOut),
    mean: valueOf(s.mean),
    median: valueOf(s.median),
    sd: valueOf(s.sampleSd), // `sd` is the sample (n − 1) SD
    populationSd: valueOf(s.populationSd),
    min: valueOf(s.min),
    max: valueOf(s.max),
    q1: valueOf(s.q1),
    q3: valueOf(s.q3),
    iqr: valueOf(s.iqr),
    lowerFence: valueOf(s.lowerFence),
    upperFence: valueOf(s.upperFence),
    outliers: s.outliers.map((o) => ({ id: book.students[studentIndices[o.index]!]!.id, value: o.value, side: o.side })),
    quantileType: s.quantileType,
    quantileMethod: s.quantileMethod,
    notes: Object.fromEntries(
      Object.entries({ mean: s.mean, median: s.median, sd: s.sampleSd, populationSd: s.populationSd, min: s.min, max: s.max, q1: s.q1, q3: s.q3, iqr: s.iqr, lowerFence: s.lowerFence, upperFence: s.upperFence })
        .flatMap(([k, d]) => (d.defined ? [] : [[k, d.reason]])),
    ),
  });
}

const SMALL_BOOK = [
  'Student ID,Name,Section,Quiz 1,Quiz 2,Exam',
  'Points possible,,,10,10,50',
  'S01,Ana Souza,A,8,9,41',
  'S02,Ben Okafor,A,6,EX,30',
  'S03,Chloé Martin,B,10,7,45',
  'S04,Dev Patel,B,,8,22',
].join('\n');

describe('weighbridge CLI: usage', () => {
  it('prints the version from package.json', async () => {
    const pkg = JSON.parse(await readFile(join(root, 'package.json'), 'utf8')) as { version: string };
    expect(await run('--version')).toEqual({ code: 0, stdout: `${pkg.version}\n`, stderr: '' });
  });

  it('prints help for the program and for each command on stdout', async () => {
    const main = await run('--help');
    expect(main.code).toBe(0);
    expect(main.stdout).toContain('Commands:');
    for (const command of ['grade', 'stats', 'check', 'init-plan']) {
      const r = await run(command, '--help');
      expect(r.code).toBe(0);
      expect(r.stdout).toContain(`Usage: weighbridge ${command}`);
    }
  });

  it.each([
    [[] as string[], 'Usage: weighbridge <command>'],
    [['frobnicate'], 'Unknown command "frobnicate"'],
    [['grade', 'book.csv'], 'grade needs --plan'],
    [['grade'], 'grade needs exactly one gradebook file'],
    [['stats', 'book.csv'], 'stats needs --column'],
    [['stats', 'book.csv', '--column', 'x', '--quantile-type', '10'], '--quantile-type must be a whole number from 1 to 9'],
    [['stats', 'book.csv', '--column', 'x', '--colour'], "Unknown option '--colour'"],
    [['grade', 'b.csv', '--plan', 'p.json', '--out', 'finals.pdf'], '--out must name a .xlsx or .csv file'],
  ])('exits 2 on usage errors: %j', async (args, message) => {
    const r = await run(...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(message);
    expect(r.stdout).toBe('');
  });
});

describe('weighbridge grade', () => {
  it('--json on the demo course equals gradeCourse and sectionStatistics called directly', async () => {
    const r = await run('grade', demoXlsx, '--plan', demoPlan, '--json');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as {
      students: { id: string; name: string; section: string; final: number | null; letter: string | null; gradePoints: number | null; weighted: number | null; effectiveWeights: Record<string, number>; notes: Record<string, string> }[];
      sections: SectionJson[];
      course: SectionJson;
    };
    const imported = await detectAndImport(demoXlsx);
    const plan = await loadPlanFile(demoPlan);
    if (!imported.ok || !plan.ok) throw new Error('demo course did not load');
    const book = imported.value.gradebook;
    const expected = gradeCourse(book, plan.value).students;
    expect(out.students.map(({ notes: _notes, ...rest }) => rest)).toEqual(
      expected.map((s, i) => ({
        id: s.studentId, name: book.students[i]!.name, section: s.section, final: s.final, letter: s.letter,
        gradePoints: s.gradePoints, weighted: s.weighted, effectiveWeights: s.effectiveWeights,
      })),
    );
    // A student without a final mark carries the reason in notes.final, and only then.
    out.students.forEach((s) => expect('final' in s.notes).toBe(s.final === null));
    // Sections and course: the engine's analysis on final marks, the numbers the Sections screen shows.
    const stats = sectionStatistics(book, expected, { measure: { kind: 'final' } });
    expect(out.sections.map((s) => s.section)).toEqual(sectionsOf(book));
    out.sections.forEach((sec, k) => {
      const g = stats.sections[k]!;
      expectSectionJson(sec, book, g.section, g.summary, g.studentIndices, g.leftOut);
      // The same figures as describe() on the section's finals, called without the analysis layer.
      const d = describeStats(expected.filter((x) => x.section === sec.section).flatMap((x) => (x.final === null ? [] : [x.final])));
      expect([sec.n, sec.mean, sec.sd, sec.q1, sec.q3]).toEqual([d.n, valueOf(d.mean), valueOf(d.sampleSd), valueOf(d.q1), valueOf(d.q3)]);
      // Every student of the section is in n or in withoutMark.
      expect(sec.n + sec.withoutMark).toBe(book.students.filter((s) => s.section === sec.section).length);
    });
    expectSectionJson(out.course, book, null, stats.course, stats.courseStudentIndices, stats.leftOut);
    expect(out.course.n).toBe(expected.filter((s) => s.final !== null).length);
    expect(out.course.withoutMark).toBe(expected.filter((s) => s.final === null).length);
    // Outliers by student ID, each strictly beyond a Tukey fence (Tukey 1977) on that student's final.
    for (const group of [...out.sections, out.course]) {
      for (const o of group.outliers) {
        const i = book.students.findIndex((s) => s.id === o.id);
        expect(expected[i]!.final).toBe(o.value);
        expect(o.side === 'low' ? o.value < group.lowerFence! : o.value > group.upperFence!).toBe(true);
      }
    }
    expect(out.course.outliers.length).toBeGreaterThan(0);
  });

  it('--quantile-type reaches the section statistics: --json equals sectionStatistics with that type', async () => {
    const r = await run('grade', demoXlsx, '--plan', demoPlan, '--json', '--quantile-type', '6');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { sections: SectionJson[]; course: SectionJson };
    const imported = await detectAndImport(demoXlsx);
    const plan = await loadPlanFile(demoPlan);
    if (!imported.ok || !plan.ok) throw new Error('demo course did not load');
    const book = imported.value.gradebook;
    const stats = sectionStatistics(book, gradeCourse(book, plan.value).students, { measure: { kind: 'final' }, quantileType: 6 });
    out.sections.forEach((sec, k) => {
      const g = stats.sections[k]!;
      expectSectionJson(sec, book, g.section, g.summary, g.studentIndices, g.leftOut);
    });
    expectSectionJson(out.course, book, null, stats.course, stats.courseStudentIndices, stats.leftOut);
    expect(out.course.quantileType).toBe(6);
  });

  it('prints a table by default and the same finals from the demo CSV as from the xlsx', async () => {
    const fromXlsx = JSON.parse((await run('grade', demoXlsx, '--plan', demoPlan, '--json')).stdout) as { students: unknown[] };
    const fromCsv = JSON.parse((await run('grade', demoCsv, '--plan', demoPlan, '--json')).stdout) as { students: unknown[] };
    expect(fromCsv.students).toEqual(fromXlsx.students);
    const text = await run('grade', demoXlsx, '--plan', demoPlan);
    expect(text.code).toBe(0);
    expect(text.stdout).toContain('All sections');
    expect(text.stdout).toContain('Hyndman');
  });

  it('--out writes the export, refuses to replace it without --overwrite, and never writes the gradebook', async () => {
    const book = await fixture('small.csv', SMALL_BOOK);
    const planOut = join(work, 'small.plan.json');
    expect((await run('init-plan', book, '--out', planOut)).code).toBe(0);
    const out = join(work, 'small-finals.csv');
    const first = await run('grade', book, '--plan', planOut, '--out', out, '--extras');
    expect(first.code).toBe(0);
    expect(first.stderr).toContain('Wrote 4 final marks');
    expect((await readFile(out, 'utf8')).startsWith('\uFEFFStudent ID,Name,Section,Final %,Letter,Grade points')).toBe(true);
    expect((await readFile(join(work, 'small-finals.breakdown.csv'), 'utf8')).length).toBeGreaterThan(0);
    const again = await run('grade', book, '--plan', planOut, '--out', out);
    expect(again.code).toBe(1);
    expect(again.stderr).toContain('already exists');
    expect((await run('grade', book, '--plan', planOut, '--out', out, '--overwrite')).code).toBe(0);
    const onSource = await run('grade', book, '--plan', planOut, '--out', book, '--overwrite');
    expect(onSource.code).toBe(1);
    expect(onSource.stderr).toContain('source spreadsheet');
    expect(await readFile(book, 'utf8')).toBe(SMALL_BOOK);
  });

  it('exits 1 on a missing gradebook, a damaged plan and an unreadable file', async () => {
    const book = await fixture('small2.csv', SMALL_BOOK);
    const missing = await run('grade', join(work, 'nope.csv'), '--plan', demoPlan);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toContain('does not exist');
    const badPlan = await fixture('bad.plan.json', '{"format":"weighbridge-plan","schemaVersion":1,"plan":{"categories":[]}}');
    const r = await run('grade', book, '--plan', badPlan);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('damaged');
    const newer = await fixture('newer.plan.json', '{"format":"weighbridge-plan","schemaVersion":9,"plan":{}}');
    const n = await run('grade', book, '--plan', newer);
    expect(n.code).toBe(1);
    expect(n.stderr).toContain('newer version of Weighbridge');
    const empty = await fixture('empty.csv', '');
    expect((await run('grade', empty, '--plan', demoPlan)).code).toBe(1);
  });
});

describe('weighbridge stats', () => {
  it('matches Hyndman & Fan (1996) worked quartiles of x = 1…10 and the exact sample variance 55/6', async () => {
    // REFERENCES.md "Hyndman & Fan (1996)": x = 1…10, type 7 Q1 3.25 / Q3 7.75; type 4 Q1 2.5 / Q3 7.5;
    // "Small exact fixtures": sample variance 55/6, sample SD 3.0276503540974917, population variance 8.25.
    const file = await fixture('ten.csv', ['Who,Score', ...Array.from({ length: 10 }, (_, i) => `p${i + 1},${i + 1}`)].join('\n'));
    const t7 = JSON.parse((await run('stats', file, '--column', 'Score', '--json')).stdout) as Record<string, unknown>;
    expect(t7['n']).toBe(10);
    expect(t7['q1']).toBeCloseTo(3.25, 12);
    expect(t7['q3']).toBeCloseTo(7.75, 12);
    expect(t7['variance']).toBeCloseTo(55 / 6, 12);
    expect(t7['sd']).toBeCloseTo(3.0276503540974917, 12);
    expect(t7['populationVariance']).toBeCloseTo(8.25, 12);
    expect(t7['quantileType']).toBe(7);
    const t4 = JSON.parse((await run('stats', file, '--column', 'score', '--quantile-type', '4', '--json')).stdout) as Record<string, unknown>;
    expect(t4['q1']).toBeCloseTo(2.5, 12);
    expect(t4['q3']).toBeCloseTo(7.5, 12);
    expect(Object.keys(t7)).toEqual(expect.arrayContaining(['n', 'mean', 'median', 'modes', 'min', 'max', 'range', 'variance', 'sd', 'populationVariance', 'populationSd', 'cv', 'q1', 'q3', 'iqr', 'lowerFence', 'upperFence', 'outliers', 'quantileType', 'notes']));
  });

  it('lists outliers beyond the Tukey fences, and the verdict depends on the quantile type', async () => {
    // REFERENCES.md "Box plots": 47,60,62,64,65,67,69,72,73,80 — type 7 fences 49.375 / 84.375, so 47
    // is an outlier; type 6 fences 45.375 / 88.375, no outlier.
    const xs = [47, 60, 62, 64, 65, 67, 69, 72, 73, 80];
    const file = await fixture('tukey.csv', ['ID,Mark', ...xs.map((x, i) => `T${i},${x}`)].join('\n'));
    const t7 = JSON.parse((await run('stats', file, '--column', 'Mark', '--json')).stdout) as { lowerFence: number; outliers: { label: string; row: number; value: number; side: string }[] };
    expect(t7.lowerFence).toBeCloseTo(49.375, 12);
    expect(t7.outliers).toEqual([{ label: 'T0', row: 2, value: 47, side: 'low' }]);
    const t6 = JSON.parse((await run('stats', file, '--column', 'Mark', '--quantile-type', '6', '--json')).stdout) as { lowerFence: number; outliers: unknown[] };
    expect(t6.lowerFence).toBeCloseTo(45.375, 12);
    expect(t6.outliers).toEqual([]);
  });

  it('--by groups the values; every figure equals describe() on the group', async () => {
    const r = await run('stats', demoCsv, '--column', 'Final exam', '--by', 'Section', '--json');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { groups: ({ group: string } & Record<string, unknown>)[]; overall: Record<string, unknown> };
    const imported = await detectAndImport(demoCsv);
    if (!imported.ok) throw new Error('demo csv did not import');
    const book = imported.value.gradebook;
    const j = book.assessments.findIndex((a) => a.name === 'Final exam');
    for (const g of out.groups) {
      const values = book.students.flatMap((s, i) => {
        const cell = book.scores[i]![j]!;
        return s.section === g.group && cell.kind === 'earned' ? [cell.points] : [];
      });
      const d = describeStats(values);
      expect(g['n']).toBe(d.n);
      expect(g['mean']).toBe(d.mean.defined ? d.mean.value : null);
      expect(g['variance']).toBe(d.sampleVariance.defined ? d.sampleVariance.value : null);
      expect(g['populationSd']).toBe(d.populationSd.defined ? d.populationSd.value : null);
      expect(g['q3']).toBe(d.q3.defined ? d.q3.value : null);
    }
    expect(out.overall['n']).toBe(out.groups.reduce((a, g) => a + (g['n'] as number), 0));
  });

  it('gives null with a reason in notes for statistics that are not defined', async () => {
    const file = await fixture('one.csv', 'Name,Value\nonly,42\n');
    const out = JSON.parse((await run('stats', file, '--column', 'Value', '--json')).stdout) as Record<string, unknown> & { notes: Record<string, string> };
    expect(out['n']).toBe(1);
    expect(out['sd']).toBe(null);
    expect(out['variance']).toBe(null);
    expect(typeof out.notes['sd']).toBe('string');
    expect(out['populationSd']).toBe(0);
  });

  it('names the sheet, row, column and value of a non-numeric cell (exit 1)', async () => {
    const file = await fixture('bad.csv', 'ID,Mark\nA,1\nB,two\n');
    const r = await run('stats', file, '--column', 'Mark');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('row 3, column B ("Mark"): "two" is not a number');
    const noColumn = await run('stats', file, '--column', 'Height');
    expect(noColumn.code).toBe(1);
    expect(noColumn.stderr).toContain('column headed "Height"');
  });

  it('writes no progress to a non-terminal stderr', async () => {
    const file = await fixture('quiet.csv', 'ID,Mark\nA,1\nB,2\n');
    const r = await run('stats', file, '--column', 'Mark');
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
  });
});

describe('weighbridge check and init-plan', () => {
  it('check reports the layout of the demo course (exit 0) and refuses an empty file (exit 1)', async () => {
    const r = await run('check', demoXlsx, '--json');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { ok: boolean; students: number; assessments: unknown[] };
    const imported = await detectAndImport(demoXlsx);
    if (!imported.ok) throw new Error('demo did not import');
    expect(out.ok).toBe(true);
    expect(out.students).toBe(imported.value.gradebook.students.length);
    expect(out.assessments.length).toBe(imported.value.gradebook.assessments.length);
    const empty = await fixture('nothing.csv', '');
    const bad = await run('check', empty);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toContain('empty');
  });

  it('init-plan prints a loadable plan file, or writes one and will not replace it without --overwrite', async () => {
    const book = await fixture('plan-src.csv', SMALL_BOOK);
    const printed = await run('init-plan', book);
    expect(printed.code).toBe(0);
    const doc = JSON.parse(printed.stdout) as { format: string; schemaVersion: number; plan: { items: Record<string, unknown> } };
    expect(doc.format).toBe('weighbridge-plan');
    expect(Object.keys(doc.plan.items).sort()).toEqual(['Exam', 'Quiz 1', 'Quiz 2']);
    const out = join(work, 'written.plan.json');
    expect((await run('init-plan', book, '--out', out)).code).toBe(0);
    expect((await loadPlanFile(out)).ok).toBe(true);
    const again = await run('init-plan', book, '--out', out);
    expect(again.code).toBe(1);
    expect(again.stderr).toContain('already exists');
    expect((await run('init-plan', book, '--out', out, '--overwrite')).code).toBe(0);
    const self = await run('init-plan', book, '--out', book, '--overwrite');
    expect(self.code).toBe(1);
    expect(await readFile(book, 'utf8')).toBe(SMALL_BOOK);
  });
});
