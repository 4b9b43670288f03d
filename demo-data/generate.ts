/**
 * Generator for the invented demo course "GEO 231 — Field Methods in Glaciology".
 *
 * Everything it writes is made up: the course, the people (names combined at random from small
 * lists of given and family names), the IDs, the e-mail addresses (at example.edu, reserved for
 * examples by RFC 2606) and every score. The numbers come from a seeded PRNG, so the same seed
 * always gives the same files, byte for byte.
 *
 * Score model (invented, only meant to look like a plausible term):
 *   P(item) = logistic(ability_student + ease_category + difficulty_item + noise_cell)
 *   ability ~ N(section mean, 0.75²), difficulty ~ N(0, 0.3²), noise ~ N(0, 0.55²),
 *   points = P · possible rounded to the item's step (0.5 or 1) and clamped to [0, possible].
 *
 * Run: `npx tsx demo-data/generate.ts` (or `npm run demo`); writes next to this file.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import * as XLSX from 'xlsx';
import type { Category, GradeCutoff, GradingPlan, ItemRule } from '../renderer/engine/model';

/** The seed the committed demo files were generated with. */
export const DEMO_SEED = 231_2024;

export const COURSE_TITLE = 'GEO 231 Field Methods in Glaciology';

// ---------------------------------------------------------------------------------------------
// Random numbers

export interface Rng {
  /** Uniform on [0, 1). */
  readonly uniform: () => number;
  /** Normal deviate (Box–Muller). */
  readonly normal: (mean: number, sd: number) => number;
  /** Integer in [lo, hi] inclusive. */
  readonly int: (lo: number, hi: number) => number;
  readonly chance: (p: number) => boolean;
  readonly pick: <T>(items: readonly T[]) => T;
}

/**
 * mulberry32, a 32-bit-state PRNG (Tommy Ettinger, 2017, public domain). Not cryptographic —
 * chosen because it is tiny and gives identical sequences on every JS engine (integer ops only).
 */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function createRng(seed: number): Rng {
  const uniform = mulberry32(seed);
  const normal = (mean: number, sd: number): number => {
    // Box–Muller (1958); 1 − u keeps the logarithm's argument in (0, 1].
    const u1 = 1 - uniform();
    const u2 = uniform();
    return mean + sd * Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
  const int = (lo: number, hi: number): number => lo + Math.floor(uniform() * (hi - lo + 1));
  const pick = <T>(items: readonly T[]): T => {
    const item = items[int(0, items.length - 1)];
    if (item === undefined) throw new Error('pick needs a non-empty list');
    return item;
  };
  return { uniform, normal, int, chance: (p) => uniform() < p, pick };
}

// ---------------------------------------------------------------------------------------------
// The course

/** A cell as written to the sheet: points, a token, or blank (null = missing work). */
export type DemoCell = number | 'EX' | 'pending' | null;

export interface DemoAssessment {
  /** Column header text; also the assessment id in the plan. */
  readonly id: string;
  readonly possible: number;
  readonly categoryId: string;
  readonly extraCredit: boolean;
  /** Scores are rounded to multiples of this. */
  readonly step: 0.5 | 1;
}

export interface DemoStudent {
  readonly id: string;
  readonly lastName: string;
  readonly firstName: string;
  readonly section: string;
  readonly email: string;
  readonly scores: readonly DemoCell[];
  readonly comment: string;
}

export interface DemoCourse {
  readonly seed: number;
  readonly sections: readonly string[];
  readonly assessments: readonly DemoAssessment[];
  readonly students: readonly DemoStudent[];
  readonly plan: GradingPlan;
}

interface SectionSpec {
  readonly name: string;
  readonly size: number;
  /** Mean ability on the logit scale (about 0.8 → 69 %, 1.6 → 83 %). */
  readonly meanAbility: number;
  /** Students drawn far below the section (the demo's low outliers). */
  readonly lowOutliers: number;
}

const SECTIONS: readonly SectionSpec[] = [
  { name: 'A01', size: 54, meanAbility: 1.6, lowOutliers: 0 },
  { name: 'A02', size: 52, meanAbility: 1.05, lowOutliers: 0 },
  { name: 'A03', size: 48, meanAbility: 1.3, lowOutliers: 0 },
  { name: 'A04', size: 58, meanAbility: 0.95, lowOutliers: 2 },
];

/** The section whose field-notebook category is waived (no field days for that section). */
const WAIVED_SECTION = 'A03';
const LAST_LAB = 'Lab 8';
const BONUS = 'Bonus: glacier photo essay';

interface CategorySpec {
  readonly category: Category;
  /** Added to every item's logit: positive = easier. */
  readonly ease: number;
  readonly items: readonly { readonly id: string; readonly possible: number; readonly step: 0.5 | 1 }[];
}

function numbered(prefix: string, count: number, possible: number, step: 0.5 | 1) {
  return Array.from({ length: count }, (_, i) => ({ id: `${prefix} ${i + 1}`, possible, step }));
}

function category(id: string, name: string, weight: number, rest: Partial<Category> = {}): Category {
  return {
    id,
    name,
    weight,
    combine: 'totalPoints',
    dropLowest: 0,
    missingAs: 'zero',
    capPercent: null,
    droppedForCourse: false,
    ...rest,
  };
}

const CATEGORY_SPECS: readonly CategorySpec[] = [
  {
    category: category('labs', 'Labs', 15, { combine: 'equalItems', dropLowest: 1 }),
    ease: 0.35,
    items: numbered('Lab', 8, 10, 0.5),
  },
  {
    category: category('notebook', 'Field notebook checks', 10),
    ease: 0.5,
    items: numbered('Notebook', 4, 20, 1),
  },
  {
    // Capped at 100 % so the extra-credit essay can lift a weak problem-set record but not past full marks.
    category: category('problem-sets', 'Problem sets', 25, { capPercent: 100 }),
    ease: 0.1,
    items: numbered('Problem set', 5, 25, 0.5),
  },
  {
    category: category('midterm', 'Midterm', 20),
    ease: -0.25,
    items: [{ id: 'Midterm', possible: 60, step: 0.5 }],
  },
  {
    category: category('final', 'Final exam', 30),
    ease: -0.1,
    items: [{ id: 'Final exam', possible: 100, step: 1 }],
  },
];

/** Our own letter scale for the demo syllabus (ASCII "-" so exports upload anywhere). */
const LETTER_SCALE: readonly GradeCutoff[] = [
  { letter: 'A+', minPercent: 97, gradePoints: 4.0, passing: true },
  { letter: 'A', minPercent: 93, gradePoints: 4.0, passing: true },
  { letter: 'A-', minPercent: 90, gradePoints: 3.7, passing: true },
  { letter: 'B+', minPercent: 87, gradePoints: 3.3, passing: true },
  { letter: 'B', minPercent: 83, gradePoints: 3.0, passing: true },
  { letter: 'B-', minPercent: 80, gradePoints: 2.7, passing: true },
  { letter: 'C+', minPercent: 77, gradePoints: 2.3, passing: true },
  { letter: 'C', minPercent: 73, gradePoints: 2.0, passing: true },
  { letter: 'C-', minPercent: 70, gradePoints: 1.7, passing: true },
  { letter: 'D+', minPercent: 67, gradePoints: 1.3, passing: true },
  { letter: 'D', minPercent: 63, gradePoints: 1.0, passing: true },
  { letter: 'D-', minPercent: 60, gradePoints: 0.7, passing: true },
  { letter: 'F', minPercent: 0, gradePoints: 0.0, passing: false },
];

// Given and family names from several languages, combined at random: nobody here is real.
const GIVEN_NAMES: readonly string[] = [
  'Zoë', 'Łukasz', 'Amara', 'Jun', 'Sigrún', 'Mateo', 'Aoife', 'Björn', 'Chiamaka', 'Dmitri',
  'Élodie', 'Farida', 'Giulia', 'Hamid', 'Ingrid', 'José', 'Kaito', 'Leilani', 'Maëlle', 'Nikolai',
  'Oluwaseun', 'Priya', 'Quentin', 'Renée', 'Søren', 'Tomás', 'Uma', 'Valentina', 'Wiremu', 'Xiadani',
  'Yusuf', 'Zsófia', 'Anaïs', 'Bogdan', 'Carmen', 'Dara', 'Eamon', 'Freya', 'Gökhan', 'Hana',
  'Iker', 'Jakub', 'Kalani', 'Linnea', 'Malik', 'Noa', 'Oskar', 'Paulína', 'Rafael', 'Saoirse',
];
const FAMILY_NAMES: readonly string[] = [
  'Ångström', 'Núñez', 'Kowalczyk', 'Okafor', 'Tanaka', 'Sigurðardóttir', 'Müller', "O'Brien",
  'Nguyễn', 'García', 'Haddad', 'Petrović', 'Lindqvist', 'Moreau', 'Rossi', 'van der Berg', 'Kim',
  'Mensah', 'Novák', 'Schröder', 'Øverland', 'Dubois', 'Ferreira', 'Ivanova', 'Jensen', 'Kaur',
  'Zieliński', 'Mahlangu', 'Yılmaz', 'Costa', 'Bergström', 'Fitzgerald', 'Herrera', 'Łopatka',
  'Papadopoulos', 'Ó Súilleabháin', 'Chen', 'Abebe', 'Castañeda', 'Håkansson',
];

/** Letters that Unicode decomposition does not reduce to ASCII. */
const ASCII_SPECIALS: Readonly<Record<string, string>> = {
  ł: 'l', Ł: 'L', ø: 'o', Ø: 'O', ð: 'd', Ð: 'D', ı: 'i', ß: 'ss', æ: 'ae', Æ: 'AE', þ: 'th',
};

/** ASCII form of a name, for e-mail addresses and the stable sort key. */
export function asciiFold(text: string): string {
  return text
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .replace(/[^\u0000-\u007f]/gu, (ch) => ASCII_SPECIALS[ch] ?? '');
}

function emailLocal(first: string, last: string): string {
  const clean = (s: string) => asciiFold(s).toLowerCase().replace(/[^a-z]/g, '');
  return `${clean(first)}.${clean(last)}`;
}

function logistic(x: number): number {
  return 1 / (1 + Math.exp(-x));
}

function roundTo(value: number, step: number): number {
  return Math.round(value / step) * step;
}

function clamp(value: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, value));
}

function compareKeys(a: string, b: string): number {
  if (a < b) return -1;
  return a > b ? 1 : 0;
}

interface Draft {
  id: string;
  firstName: string;
  lastName: string;
  section: string;
  email: string;
  ability: number;
  missRate: number;
  scores: DemoCell[];
  comments: string[];
}

/** Builds the whole invented course from a seed. Pure: no I/O. */
export function buildDemoCourse(seed: number = DEMO_SEED): DemoCourse {
  const rng = createRng(seed);

  const assessments: DemoAssessment[] = CATEGORY_SPECS.flatMap((spec) =>
    spec.items.map((item) => ({ ...item, categoryId: spec.category.id, extraCredit: false })),
  );
  assessments.push({ id: BONUS, possible: 5, categoryId: 'problem-sets', extraCredit: true, step: 1 });
  const logitOffset = new Map<string, number>();
  for (const spec of CATEGORY_SPECS) {
    for (const item of spec.items) logitOffset.set(item.id, spec.ease + rng.normal(0, 0.3));
  }
  const index = (id: string): number => {
    const i = assessments.findIndex((a) => a.id === id);
    if (i < 0) throw new Error(`unknown assessment ${id}`);
    return i;
  };

  // People.
  const usedIds = new Set<string>();
  const usedEmails = new Set<string>();
  const drafts: Draft[] = [];
  for (const section of SECTIONS) {
    for (let k = 0; k < section.size; k++) {
      let id: string;
      do id = `G23${String(rng.int(0, 99_999)).padStart(5, '0')}`;
      while (usedIds.has(id));
      usedIds.add(id);
      const firstName = rng.pick(GIVEN_NAMES);
      let lastName = rng.pick(FAMILY_NAMES);
      if (rng.chance(0.06)) lastName = `${lastName}-${rng.pick(FAMILY_NAMES)}`;
      let local = emailLocal(firstName, lastName);
      for (let n = 2; usedEmails.has(local); n++) local = `${emailLocal(firstName, lastName)}${n}`;
      usedEmails.add(local);
      const outlier = k < section.lowOutliers;
      const ability = outlier ? rng.normal(-1.2, 0.25) : rng.normal(section.meanAbility, 0.75);
      const missRate = outlier ? 0.35 : clamp(0.05 - 0.02 * ability, 0.005, 0.2);
      drafts.push({
        id, firstName, lastName, section: section.name, email: `${local}@example.edu`,
        ability, missRate, scores: [], comments: [],
      });
    }
  }

  // Scores.
  for (const d of drafts) {
    for (const a of assessments) {
      if (a.extraCredit) {
        // Most students skip the optional essay: blank.
        d.scores.push(rng.chance(0.25 + 0.08 * d.ability) ? clamp(roundTo(a.possible * logistic(d.ability + 0.6 + rng.normal(0, 0.8)), a.step), 0, a.possible) : null);
        continue;
      }
      const exam = a.categoryId === 'midterm' || a.categoryId === 'final';
      if (rng.chance(exam ? 0.004 : d.missRate)) { d.scores.push(null); continue; }
      if (!exam && rng.chance(0.012)) { d.scores.push('EX'); continue; }
      const p = logistic(d.ability + (logitOffset.get(a.id) ?? 0) + rng.normal(0, 0.55));
      d.scores.push(clamp(roundTo(p * a.possible, a.step), 0, a.possible));
    }
  }

  // Scenario details on top of the random draw, each one named in the README.
  const inSection = (s: string) => drafts.filter((d) => d.section === s);
  for (const d of inSection(WAIVED_SECTION)) {
    // A03 had no field days. Its TA wrote EX on the first check, then left the column blank.
    d.scores[index('Notebook 1')] = 'EX';
    for (const n of [2, 3, 4]) d.scores[index(`Notebook ${n}`)] = null;
  }
  for (const d of drafts) {
    if (d.scores[index(LAST_LAB)] !== null && rng.chance(0.035)) d.scores[index(LAST_LAB)] = 'pending';
  }
  for (const d of drafts) {
    assessments.forEach((a, i) => {
      if (d.scores[i] !== 'EX' || a.categoryId === 'notebook') return;
      d.comments.push(`${a.id} excused (${a.categoryId === 'labs' ? 'field-trip clash' : 'documented illness'})`);
    });
  }
  // Late enrolments: excused from Lab 1 (one comment has a comma and quotes, as real ones do).
  const lateA02 = rng.pick(inSection('A02'));
  lateA02.scores[index('Lab 1')] = 'EX';
  lateA02.comments.push('Enrolled late, Lab 1 "EX" per coordinator');
  const lateA04 = rng.pick(inSection('A04').slice(2));
  lateA04.scores[index('Lab 1')] = 'EX';
  lateA04.comments.push('Enrolled in week 2');
  for (const outlier of inSection('A04').slice(0, 2)) outlier.comments.push('Contacted advisor re. missing work');
  // One accommodation: the midterm does not count for this student (the plan has the waiver).
  const accommodated = rng.pick(inSection('A01'));
  accommodated.scores[index('Midterm')] = 'EX';
  accommodated.comments.push('Midterm waived: accommodation on file');
  // Two essays marked above the 5 points possible — allowed on extra credit only.
  const essayists = drafts.filter((d) => typeof d.scores[index(BONUS)] === 'number' && d !== accommodated);
  const over = [rng.pick(essayists.slice(0, essayists.length >> 1)), rng.pick(essayists.slice(essayists.length >> 1))];
  over.forEach((d, k) => {
    d.scores[index(BONUS)] = 6 + k;
    d.comments.push('Photo essay marked above possible (exceptional)');
  });

  const sortKey = (d: Draft) => `${d.section}\u0000${asciiFold(d.lastName).toLowerCase()}\u0000${asciiFold(d.firstName).toLowerCase()}\u0000${d.id}`;
  drafts.sort((a, b) => compareKeys(sortKey(a), sortKey(b)));

  const students: DemoStudent[] = drafts.map((d) => ({
    id: d.id,
    lastName: d.lastName,
    firstName: d.firstName,
    section: d.section,
    email: d.email,
    scores: d.scores,
    comment: d.comments.join('; '),
  }));

  const items: Record<string, ItemRule> = {};
  for (const a of assessments) items[a.id] = { categoryId: a.categoryId, extraCredit: a.extraCredit };

  const plan: GradingPlan = {
    categories: CATEGORY_SPECS.map((s) => s.category),
    items,
    sectionWaivers: [
      {
        section: WAIVED_SECTION,
        categoryId: 'notebook',
        note: 'A03 (weekend section) had no field days, so there were no notebook checks; the category is waived for the section.',
      },
    ],
    studentWaivers: [
      {
        studentId: accommodated.id,
        categoryId: 'midterm',
        note: 'Accommodation: documented illness in midterm week; the midterm weight is re-normalised over the other categories.',
      },
    ],
    markMode: 'current',
    scale: { name: 'GEO 231 letter scale', cutoffs: LETTER_SCALE },
    rounding: { decimals: 0 },
    adjustments: [],
  };

  return { seed, sections: SECTIONS.map((s) => s.name), assessments, students, plan };
}

// ---------------------------------------------------------------------------------------------
// Writing the files

type Row = (string | number | null)[];

const ID_HEADERS = ['Student ID', 'Last name', 'First name', 'Section', 'Email'] as const;

function numericTotal(scores: readonly DemoCell[]): number {
  // The kind of plain SUM column instructors keep; the importer is meant to ignore it.
  return scores.reduce<number>((sum, s) => (typeof s === 'number' ? sum + s : sum), 0);
}

/** Header, points-possible row and student rows; `withSection` false for one-sheet-per-section. */
function tableRows(course: DemoCourse, students: readonly DemoStudent[], withSection: boolean): Row[] {
  const idHeaders: string[] = withSection ? [...ID_HEADERS] : ID_HEADERS.filter((h) => h !== 'Section');
  const header: Row = [...idHeaders, ...course.assessments.map((a) => a.id), 'Total', 'Comments'];
  const possible: Row = ['Points possible', ...idHeaders.slice(1).map(() => null), ...course.assessments.map((a) => a.possible), null, null];
  const body = students.map((s): Row => [
    s.id,
    s.lastName,
    s.firstName,
    ...(withSection ? [s.section] : []),
    s.email,
    ...s.scores,
    numericTotal(s.scores),
    s.comment === '' ? null : s.comment,
  ]);
  return [header, possible, ...body];
}

/** A sheet with a title row, a blank row, then the table; the Total column holds SUM formulas. */
function scoresSheet(course: DemoCourse, students: readonly DemoStudent[], withSection: boolean, title: string): XLSX.WorkSheet {
  const table = tableRows(course, students, withSection);
  const sheet = XLSX.utils.aoa_to_sheet([[title], [], ...table]);
  const firstScoreCol = withSection ? ID_HEADERS.length : ID_HEADERS.length - 1;
  const lastScoreCol = firstScoreCol + course.assessments.length - 1;
  const totalCol = lastScoreCol + 1;
  const firstStudentRow = 4; // 0-based: title, blank, header, points possible
  for (let r = firstStudentRow; r < firstStudentRow + students.length; r++) {
    const addr = XLSX.utils.encode_cell({ r, c: totalCol });
    const cell = sheet[addr] as XLSX.CellObject | undefined;
    if (cell === undefined) throw new Error(`no Total cell at ${addr}`);
    const from = XLSX.utils.encode_cell({ r, c: firstScoreCol });
    const to = XLSX.utils.encode_cell({ r, c: lastScoreCol });
    cell.f = `SUM(${from}:${to})`;
  }
  const widths = [11, 22, 12, ...(withSection ? [8] : []), 34, ...course.assessments.map((a) => Math.max(8, a.id.length + 1)), 8, 48];
  sheet['!cols'] = widths.map((wch) => ({ wch }));
  return sheet;
}

/** Fixed workbook properties so re-generation gives identical bytes. */
function newWorkbook(title: string): XLSX.WorkBook {
  const book = XLSX.utils.book_new();
  const fixed = new Date(Date.UTC(2024, 11, 20, 12, 0, 0));
  book.Props = { Title: title, Author: 'Weighbridge demo generator', CreatedDate: fixed, ModifiedDate: fixed };
  return book;
}

function toBuffer(book: XLSX.WorkBook): Buffer {
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

export function courseWorkbook(course: DemoCourse): Buffer {
  const book = newWorkbook(COURSE_TITLE);
  const title = `${COURSE_TITLE} — term scores (generated demo data)`;
  XLSX.utils.book_append_sheet(book, scoresSheet(course, course.students, true, title), 'Scores');
  return toBuffer(book);
}

export function sectionsWorkbook(course: DemoCourse): Buffer {
  const book = newWorkbook(`${COURSE_TITLE} — by section`);
  for (const section of course.sections) {
    const title = `${COURSE_TITLE} — section ${section} term scores (generated demo data)`;
    const students = course.students.filter((s) => s.section === section);
    XLSX.utils.book_append_sheet(book, scoresSheet(course, students, false, title), section);
  }
  return toBuffer(book);
}

/** UTF-8 without BOM, comma-delimited, LF line ends, header first (no title row). */
export function courseCsv(course: DemoCourse): string {
  return `${Papa.unparse(tableRows(course, course.students, true), { newline: '\n' })}\n`;
}

export function planFile(course: DemoCourse): string {
  const file = { format: 'weighbridge-plan', schemaVersion: 1, plan: course.plan } as const;
  return `${JSON.stringify(file, null, 2)}\n`;
}

export const DEMO_FILES = {
  workbook: 'glaciology-231.xlsx',
  csv: 'glaciology-231.csv',
  sections: 'glaciology-231-sections.xlsx',
  plan: 'glaciology-231.plan.json',
} as const;

/** Writes the four demo files into `outDir`; returns their full paths. */
export async function generateDemo(outDir: string, seed: number = DEMO_SEED): Promise<string[]> {
  const course = buildDemoCourse(seed);
  await mkdir(outDir, { recursive: true });
  const outputs: [string, Buffer | string][] = [
    [DEMO_FILES.workbook, courseWorkbook(course)],
    [DEMO_FILES.csv, courseCsv(course)],
    [DEMO_FILES.sections, sectionsWorkbook(course)],
    [DEMO_FILES.plan, planFile(course)],
  ];
  const written: string[] = [];
  for (const [name, data] of outputs) {
    const file = path.join(outDir, name);
    await writeFile(file, data);
    written.push(file);
  }
  return written;
}

const thisFile = fileURLToPath(import.meta.url);
if (process.argv[1] !== undefined && path.resolve(process.argv[1]) === thisFile) {
  generateDemo(path.dirname(thisFile)).then(
    (files) => {
      for (const f of files) console.log(`wrote ${path.relative(process.cwd(), f)}`);
    },
    (error: unknown) => {
      console.error(error);
      process.exitCode = 1;
    },
  );
}
