/**
 * The committed demo files are what the generator makes (byte for byte), and the course has the
 * shape the demo needs. The demo data is invented: these tests check the generator's contract,
 * never any grading or statistics result.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import * as XLSX from 'xlsx';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GradingPlan } from '../../renderer/engine/model';
import { DEMO_FILES, DEMO_SEED, buildDemoCourse, courseCsv, createRng, generateDemo, mulberry32 } from '../../demo-data/generate';

const demoDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../demo-data');
const ID_COLUMNS = ['Student ID', 'Last name', 'First name', 'Section', 'Email'];
const TRAILING_COLUMNS = ['Total', 'Comments'];

let regenerated = '';
beforeAll(async () => {
  regenerated = await mkdtemp(path.join(tmpdir(), 'weighbridge-demo-'));
  await generateDemo(regenerated);
});
afterAll(async () => {
  if (regenerated !== '') await rm(regenerated, { recursive: true, force: true });
});

async function committed(name: string): Promise<Buffer> {
  return readFile(path.join(demoDir, name));
}

function parseCsv(bytes: Buffer): string[][] {
  const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

interface PlanFile {
  format: string;
  schemaVersion: number;
  plan: GradingPlan;
}

async function committedPlan(): Promise<PlanFile> {
  return JSON.parse((await committed(DEMO_FILES.plan)).toString('utf8')) as PlanFile;
}

describe('demo files are reproducible from the seed', () => {
  it.each([DEMO_FILES.csv, DEMO_FILES.plan, DEMO_FILES.workbook, DEMO_FILES.sections])(
    '%s is byte-identical when regenerated',
    async (name) => {
      const again = await readFile(path.join(regenerated, name));
      expect(again.equals(await committed(name))).toBe(true);
    },
  );

  it('another seed gives a different course', () => {
    expect(courseCsv(buildDemoCourse(DEMO_SEED + 1))).not.toBe(courseCsv(buildDemoCourse(DEMO_SEED)));
  });

  it('the PRNG repeats its sequence for a seed and stays in [0, 1)', () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const draws = Array.from({ length: 1000 }, () => a());
    expect(Array.from({ length: 1000 }, () => b())).toEqual(draws);
    expect(draws.every((u) => u >= 0 && u < 1)).toBe(true);
    expect(new Set(draws).size).toBeGreaterThan(990);
  });

  it('Box–Muller deviates have about the requested mean and SD', () => {
    // Loose bounds: for n = 20 000 the standard error of the mean is 0.007 and of the SD about 0.005.
    const rng = createRng(7);
    const xs = Array.from({ length: 20_000 }, () => rng.normal(3, 2));
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    const sd = Math.sqrt(xs.reduce((s, x) => s + (x - mean) ** 2, 0) / (xs.length - 1));
    expect(Math.abs(mean - 3)).toBeLessThan(0.1);
    expect(Math.abs(sd - 2)).toBeLessThan(0.1);
  });
});

describe('committed CSV', () => {
  it('is UTF-8 without a BOM and keeps accented names', async () => {
    const bytes = await committed(DEMO_FILES.csv);
    expect([...bytes.subarray(0, 3)]).not.toEqual([0xef, 0xbb, 0xbf]);
    const text = bytes.toString('utf8');
    expect(text.startsWith('Student ID,')).toBe(true);
    expect(text).toMatch(/[À-ž]/u);
  });

  it('has the course shape the demo needs', async () => {
    const [header, possibleRow, ...students] = parseCsv(await committed(DEMO_FILES.csv));
    if (header === undefined || possibleRow === undefined) throw new Error('CSV has no header');
    expect(header.slice(0, 5)).toEqual(ID_COLUMNS);
    expect(header.slice(-2)).toEqual(TRAILING_COLUMNS);
    expect(possibleRow[0]).toBe('Points possible');

    const assessments = header.slice(5, -2);
    expect(assessments.length).toBeGreaterThanOrEqual(15);
    expect(assessments.length).toBeLessThanOrEqual(25);
    expect(new Set(assessments).size).toBe(assessments.length);
    const possible = possibleRow.slice(5, -2).map(Number);
    expect(possible.every((p) => Number.isFinite(p) && p > 0)).toBe(true);

    expect(students.length).toBeGreaterThanOrEqual(150);
    expect(students.length).toBeLessThanOrEqual(250);
    const sections = new Set(students.map((r) => r[3]));
    expect(sections.size).toBeGreaterThanOrEqual(3);
    expect(sections.size).toBeLessThanOrEqual(4);

    const ids = students.map((r) => r[0] ?? '');
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids.every((id) => /^G23\d{5}$/.test(id))).toBe(true);
    expect(students.every((r) => /^[a-z0-9.]+@example\.edu$/.test(r[4] ?? ''))).toBe(true);

    const cells = students.flatMap((r) => r.slice(5, -2));
    expect(cells).toContain('EX');
    expect(cells).toContain('');
    expect(cells).toContain('pending');
    expect(cells.every((c) => c === '' || c === 'EX' || c === 'pending' || /^\d+(\.5)?$/.test(c))).toBe(true);
  });

  it('has scores above possible only on extra-credit items, and the A03 notebooks blank or EX', async () => {
    const [header = [], possibleRow = [], ...students] = parseCsv(await committed(DEMO_FILES.csv));
    const { plan } = await committedPlan();
    const above = new Set<string>();
    for (const row of students) {
      for (let c = 5; c < header.length - 2; c++) {
        const value = Number(row[c]);
        if (row[c] !== '' && Number.isFinite(value) && value > Number(possibleRow[c])) above.add(header[c] ?? '');
      }
    }
    expect(above.size).toBeGreaterThan(0);
    for (const id of above) expect(plan.items[id]?.extraCredit).toBe(true);

    const notebookColumns = header.flatMap((h, c) => (plan.items[h]?.categoryId === 'notebook' ? [c] : []));
    expect(notebookColumns.length).toBeGreaterThan(0);
    const a03 = students.filter((r) => r[3] === 'A03');
    expect(a03.length).toBeGreaterThan(0);
    for (const row of a03) for (const c of notebookColumns) expect(['', 'EX']).toContain(row[c]);
  });
});

describe('committed plan', () => {
  it('is a version-1 plan whose items are exactly the assessment headers', async () => {
    const file = await committedPlan();
    expect(file.format).toBe('weighbridge-plan');
    expect(file.schemaVersion).toBe(1);
    const [header = []] = parseCsv(await committed(DEMO_FILES.csv));
    expect(Object.keys(file.plan.items).sort()).toEqual(header.slice(5, -2).sort());
  });

  it('has 4–6 categories weighing 100 in all, every item in one of them', async () => {
    const { plan } = await committedPlan();
    expect(plan.categories.length).toBeGreaterThanOrEqual(4);
    expect(plan.categories.length).toBeLessThanOrEqual(6);
    expect(plan.categories.reduce((s, c) => s + c.weight, 0)).toBe(100);
    const categoryIds = new Set(plan.categories.map((c) => c.id));
    for (const rule of Object.values(plan.items)) expect(categoryIds.has(rule.categoryId ?? '')).toBe(true);
    expect(Object.values(plan.items).filter((r) => r.extraCredit)).toHaveLength(1);
  });

  it('waives the notebook for A03 and one category for one student on the roster', async () => {
    const { plan } = await committedPlan();
    expect(plan.sectionWaivers).toEqual([expect.objectContaining({ section: 'A03', categoryId: 'notebook' })]);
    expect(plan.studentWaivers).toHaveLength(1);
    const waiver = plan.studentWaivers[0];
    expect(waiver?.note ?? '').not.toBe('');
    const [, , ...students] = parseCsv(await committed(DEMO_FILES.csv));
    expect(students.map((r) => r[0])).toContain(waiver?.studentId);
  });

  it('has a letter scale with +/- letters, grade points and a 0 % bottom', async () => {
    const { plan } = await committedPlan();
    const letters = plan.scale.cutoffs.map((c) => c.letter);
    expect(letters).toEqual(expect.arrayContaining(['A+', 'A-', 'F']));
    expect(plan.scale.cutoffs.every((c) => typeof c.gradePoints === 'number')).toBe(true);
    expect(Math.min(...plan.scale.cutoffs.map((c) => c.minPercent))).toBe(0);
    expect(plan.markMode).toBe('current');
    expect(plan.rounding.decimals).toBe(0);
  });
});

describe('committed workbooks hold the same data as the CSV', () => {
  function sheetRows(book: XLSX.WorkBook, name: string): string[][] {
    const sheet = book.Sheets[name];
    if (sheet === undefined) throw new Error(`no sheet ${name}`);
    // raw: false gives each cell's text, which for these plain numbers equals the CSV text.
    return XLSX.utils.sheet_to_json<string[]>(sheet, { header: 1, raw: false, defval: '', blankrows: true });
  }

  it('"Scores" sheet: title row, blank row, then the CSV rows; numbers stored as numbers', async () => {
    const book = XLSX.read(await committed(DEMO_FILES.workbook));
    expect(book.SheetNames).toEqual(['Scores']);
    const rows = sheetRows(book, 'Scores');
    expect(rows[0]?.[0]).toContain('generated demo data');
    expect(rows[1]?.every((c) => c === '')).toBe(true);
    expect(rows.slice(2)).toEqual(parseCsv(await committed(DEMO_FILES.csv)));
    const sheet = book.Sheets.Scores;
    expect(sheet?.F4?.t).toBe('n');
    expect(sheet?.A5?.t).toBe('s');
  });

  it('sections workbook: one sheet per section, without the section column', async () => {
    const csv = parseCsv(await committed(DEMO_FILES.csv));
    const [header = [], possibleRow = [], ...students] = csv;
    const dropSection = (r: string[]) => r.filter((_, c) => c !== 3);
    const book = XLSX.read(await committed(DEMO_FILES.sections));
    const sections = [...new Set(students.map((r) => r[3] ?? ''))];
    expect(book.SheetNames).toEqual(sections);
    for (const section of sections) {
      const expected = [header, possibleRow, ...students.filter((r) => r[3] === section)].map(dropSection);
      expect(sheetRows(book, section).slice(2)).toEqual(expected);
    }
  });
});

describe('README', () => {
  it('states that the data is invented and names the seed', async () => {
    const readme = (await committed('README.md')).toString('utf8');
    expect(readme).toMatch(/invented/i);
    expect(readme).toContain(String(DEMO_SEED));
  });
});
