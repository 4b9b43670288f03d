/**
 * `grade` on a .csv/.tsv streams the file row by row above a size (WEIGHBRIDGE_STREAM_ABOVE, set
 * to 0 here to force it) and imports it in memory below. The two paths must print the same bytes:
 * stdout (JSON and tables), the --out CSV, the warnings, and the same errors with exit code 1.
 * The in-memory path (detectAndImport + gradeCourse + sectionStatistics) is the reference; it is
 * tested against published values in cli.test.ts and the engine's tests. The streamed run is
 * recognised by its progress lines (the row-by-row reading, and no in-memory reading after it), so a
 * silent fall-back would fail these tests.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli, type CliIo } from '../../main/cli';
import { streamImportText } from '../../main/services/spreadsheet';

const root = fileURLToPath(new URL('../../', import.meta.url));
const demoCsv = join(root, 'demo-data', 'glaciology-231.csv');
const demoPlan = join(root, 'demo-data', 'glaciology-231.plan.json');

let work: string;
beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'wb-cli-stream-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

interface Run {
  code: number;
  stdout: string;
  stderr: string[];
  streamed: boolean;
}

async function run(mode: 'stream' | 'memory', args: string[]): Promise<Run> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t), progress: true };
  const before = process.env['WEIGHBRIDGE_STREAM_ABOVE'];
  process.env['WEIGHBRIDGE_STREAM_ABOVE'] = mode === 'stream' ? '0' : String(2 ** 40);
  try {
    const code = await runCli(args, io);
    // Progress lines (stderr only on a terminal) differ by design; everything else must not.
    const isProgress = (l: string) => /^Reading |^Grading |^ {2}\d+ rows graded/.test(l);
    // Streamed: the row-by-row reading began and the in-memory reading ("Reading <file>…") never
    // followed it — a fall-back prints that line after the row-by-row one.
    const reads = err.filter((l) => l.startsWith('Reading '));
    const streamed = reads.length > 0 && reads.every((l) => l.includes('row by row'));
    return { code, stdout: out.join('\n'), stderr: err.filter((l) => !isProgress(l)), streamed };
  } finally {
    if (before === undefined) delete process.env['WEIGHBRIDGE_STREAM_ABOVE'];
    else process.env['WEIGHBRIDGE_STREAM_ABOVE'] = before;
  }
}

async function both(args: string[], streams = true): Promise<{ stream: Run; memory: Run }> {
  const stream = await run('stream', args);
  const memory = await run('memory', args);
  expect(stream.streamed).toBe(streams);
  expect(memory.streamed).toBe(false);
  return { stream, memory };
}

const plan = {
  format: 'weighbridge-plan',
  schemaVersion: 1,
  plan: {
    categories: [
      { id: 'quizzes', name: 'Quizzes', weight: 30, combine: 'equalItems', dropLowest: 1, missingAs: 'zero', capPercent: 100, droppedForCourse: false },
      { id: 'labs', name: 'Labs', weight: 30, combine: 'totalPoints', dropLowest: 0, missingAs: 'excluded', capPercent: null, droppedForCourse: false },
      { id: 'exam', name: 'Exam', weight: 40, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false },
    ],
    items: {
      'Quiz 1': { categoryId: 'quizzes', extraCredit: false },
      'Quiz 2': { categoryId: 'quizzes', extraCredit: false },
      'Quiz 3': { categoryId: 'quizzes', extraCredit: false },
      Bonus: { categoryId: 'quizzes', extraCredit: true },
      'Lab 1': { categoryId: 'labs', extraCredit: false },
      'Lab 2': { categoryId: 'labs', extraCredit: false },
      Exam: { categoryId: 'exam', extraCredit: false },
    },
    sectionWaivers: [{ section: 'B', categoryId: 'labs' }],
    studentWaivers: [
      { studentId: 'S0003', categoryId: 'exam' },
      { studentId: 'S0007', categoryId: 'quizzes' },
      { studentId: 'S0007', categoryId: 'exam' },
    ],
    markMode: 'current',
    scale: {
      name: 'Letters',
      cutoffs: [
        { letter: 'A', minPercent: 85, gradePoints: 4 },
        { letter: 'B', minPercent: 70, gradePoints: 3 },
        { letter: 'C', minPercent: 55, gradePoints: 2 },
        { letter: 'D', minPercent: 40, gradePoints: 1 },
      ],
    },
    rounding: { decimals: 1 },
    adjustments: [{ kind: 'scaleToMean', section: 'A', targetMean: 72 }, { kind: 'addPoints', section: null, points: 1.5 }],
  },
};

/** Deterministic cells covering earned, decimal-comma, excused, missing, pending, above possible. */
function cell(i: number, j: number, possible: number): string {
  const k = (i * 7 + j * 13) % 23;
  if (k === 0) return 'EX';
  if (k === 1) return '';
  if (k === 2) return 'pending';
  if (k === 3) return '-';
  if (k === 4 && j === 6) return String(possible + 2); // above possible: kept with a warning
  if (k === 5) return `${(possible * 0.55).toFixed(1).replace('.', ',')}`;
  return String(Math.round(((i * 31 + j * 17) % 100) / 100 * possible * 2) / 2);
}

function gradebookCsv(students: number, extra: (lines: string[]) => void = () => undefined): string {
  const possible = [10, 10, 10, 5, 20, 20, 50];
  const lines = ['Student ID,Name,Section,Quiz 1,Quiz 2,Quiz 3,Bonus,Lab 1,Lab 2,Exam', `Points possible,,,${possible.join(',')}`];
  for (let i = 1; i <= students; i++) {
    const id = `S${String(i).padStart(4, '0')}`;
    const section = ['A', 'B', 'C10', 'C9'][i % 4]!;
    const name = i % 5 === 0 ? `"Nguyễn, Ana ${i}"` : `Student ${i}`;
    const scores = possible.map((p, j) => (i === 7 && j >= 4 && j <= 5 ? '' : i === 11 ? '0' : cell(i, j, p)));
    lines.push([id, name, section, ...scores].join(','));
    if (i === 40) lines.push('');
  }
  extra(lines);
  return `${lines.join('\r\n')}\r\n`;
}

describe('grade streams a text gradebook with the in-memory output', () => {
  it('demo CSV: --json, table and --out CSV are identical', async () => {
    const j = await both(['grade', demoCsv, '--plan', demoPlan, '--json']);
    expect(j.stream.code).toBe(0);
    expect(j.stream.stdout).toBe(j.memory.stdout);
    expect(j.stream.stderr).toEqual(j.memory.stderr);
    expect(JSON.parse(j.stream.stdout).students.length).toBeGreaterThan(100);

    const outS = join(work, 'demo-s.csv');
    const outM = join(work, 'demo-m.csv');
    const s = await run('stream', ['grade', demoCsv, '--plan', demoPlan, '--out', outS]);
    const m = await run('memory', ['grade', demoCsv, '--plan', demoPlan, '--out', outM]);
    expect(s.streamed).toBe(true);
    expect(s.code).toBe(0);
    expect(s.stdout).toBe(m.stdout);
    expect(await readFile(outS)).toEqual(await readFile(outM));
  });

  it('generated course with excused/missing/pending, extra credit, waivers, adjustments, no-mark and no-letter students', async () => {
    const csv = join(work, 'course.csv');
    const planPath = join(work, 'course.plan.json');
    await writeFile(csv, gradebookCsv(300, (lines) => lines.push('Average,,,5,5,5,2,10,10,25')));
    await writeFile(planPath, JSON.stringify(plan));
    const j = await both(['grade', csv, '--plan', planPath, '--json', '--quantile-type', '6']);
    expect(j.stream.code).toBe(0);
    expect(j.stream.stdout).toBe(j.memory.stdout);
    expect(j.stream.stderr).toEqual(j.memory.stderr);
    const parsed = JSON.parse(j.stream.stdout) as { students: { id: string; final: number | null; letter: string | null; notes: Record<string, string> }[]; importWarnings: string[] };
    // The cases the file was built to hold are really in it (else the comparison proves little).
    expect(parsed.students.find((s) => s.id === 'S0007')?.final).toBeNull();
    expect(parsed.students.some((s) => s.final !== null && s.letter === null)).toBe(true);
    expect(parsed.importWarnings.some((w) => w.includes('above the'))).toBe(true);
    expect(parsed.importWarnings.some((w) => w.includes('summary'))).toBe(true);

    const t = await both(['grade', csv, '--plan', planPath]);
    expect(t.stream.stdout).toBe(t.memory.stdout);
  });

  it('a TSV in UTF-16LE with a byte-order mark', async () => {
    const tsv = join(work, 'course16.tsv');
    const text = gradebookCsv(80).replace(/"/g, '').replace(/,(?=[^ ])/g, '\t').replace(/Nguyễn\t/g, 'Nguyễn, ');
    await writeFile(tsv, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    const planPath = join(work, 'course16.plan.json');
    await writeFile(planPath, JSON.stringify(plan));
    const j = await both(['grade', tsv, '--plan', planPath, '--json']);
    expect(j.stream.code).toBe(0);
    expect(j.stream.stdout).toBe(j.memory.stdout);
  });

  it('a file over the detection prefix whose only non-UTF-8 byte is near the end is read as Windows-1252', async () => {
    const csv = join(work, 'big1252.csv');
    const body = gradebookCsv(90_000).replace(/Nguyễn/g, 'Nguyen');
    const cut = body.lastIndexOf('Student ');
    const bytes = Buffer.concat([Buffer.from(body.slice(0, cut), 'latin1'), Buffer.from([0xc9]), Buffer.from(body.slice(cut + 1), 'latin1')]);
    expect(bytes.length).toBeGreaterThan(4 * 1024 * 1024);
    await writeFile(csv, bytes);
    const planPath = join(work, 'big.plan.json');
    await writeFile(planPath, JSON.stringify(plan));
    const j = await both(['grade', csv, '--plan', planPath, '--json']);
    expect(j.stream.code).toBe(0);
    expect(j.stream.stdout).toBe(j.memory.stdout);
    expect(j.stream.stdout).toContain('\u00c9tudent'); // 0xC9 is É in Windows-1252
  }, 120_000);

  it('a file over the detection prefix whose last row has a cell past column XFD: imported in memory, the same output', async () => {
    // Detection on the first rows alone would not see the cell; the whole file's detection warns
    // that cells past XFD were ignored. The head-and-check rule (textHead.ts) sees a row wider than
    // the head and sends the import to memory, so the warning is there in both runs.
    const csv = join(work, 'lateColumn.csv');
    const body = gradebookCsv(90_000).replace(/Nguyễn/g, 'Nguyen');
    expect(Buffer.byteLength(body)).toBeGreaterThan(4 * 1024 * 1024);
    await writeFile(csv, `${body}S-late,Late,A,1,1,1,1,1,1,1${','.repeat(16_400)}note\r\n`);
    const planPath = join(work, 'lateColumn.plan.json');
    await writeFile(planPath, JSON.stringify(plan));
    expect(await streamImportText(csv, { begin: () => undefined, row: () => undefined })).toBeNull();
    const j = await both(['grade', csv, '--plan', planPath, '--json'], false); // began row by row, then fell back to memory
    expect(j.stream.code).toBe(0);
    expect(j.stream.stdout).toBe(j.memory.stdout);
    expect(j.stream.stderr).toEqual(j.memory.stderr);
    expect(j.stream.stderr.join('\n')).toMatch(/cells to the right of column XFD/);
  }, 120_000);

  it('errors: the same located messages and exit code 1', async () => {
    const csv = join(work, 'bad.csv');
    await writeFile(csv, gradebookCsv(60, (lines) => {
      lines.splice(10, 0, 'S0004,Again,A,1,1,1,1,1,1,1'); // duplicate ID
      lines.splice(20, 0, ',Nobody,A,1,1,1,1,1,1,1'); // blank ID
      lines.push('S9999,Odd,A,seven,1,1,1,-3,1,1'); // unreadable and negative scores
    }));
    const planPath = join(work, 'bad.plan.json');
    await writeFile(planPath, JSON.stringify(plan));
    const r = await both(['grade', csv, '--plan', planPath, '--json']);
    expect(r.stream.code).toBe(1);
    expect(r.memory.code).toBe(1);
    expect(r.stream.stdout).toBe('');
    expect(r.stream.stderr).toEqual(r.memory.stderr);
    const text = r.stream.stderr.join('\n');
    expect(text).toMatch(/Sheet "bad", row \d+, column A \("Student ID"\): student ID "S0004" is already used on row 6/);
    expect(text).toMatch(/column D \("Quiz 1"\)/);
    expect(text).toMatch(/column H \("Lab 1"\): "-3" is negative/);
  });

  it('a malformed quote late in the file: the same message', async () => {
    const csv = join(work, 'quote.csv');
    await writeFile(csv, gradebookCsv(50, (lines) => lines.push('S8888,"Broken name,A,1,1,1,1,1,1,1')));
    const planPath = join(work, 'quote.plan.json');
    await writeFile(planPath, JSON.stringify(plan));
    const r = await both(['grade', csv, '--plan', planPath]);
    expect(r.stream.code).toBe(1);
    expect(r.stream.stderr).toEqual(r.memory.stderr);
  });
});
