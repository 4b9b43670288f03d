/**
 * Grading a gradebook one row at a time, for files too large to hold as Score objects (the CLI on
 * a million rows). The plan is compiled once (compilePlan); each row arrives as typed cells
 * (earned points + state byte per assessment, in a reused buffer) and only its weighted percent,
 * section and label are kept — 8 bytes, one status byte per category and two references per
 * student (the statuses give effectiveWeightsOf in the result). Adjustments (which need
 * section means) and rounding run in finish(), over the kept weighted percents, with the same code
 * as the in-memory fast path, so the finals equal gradeCourse's exactly (property-tested).
 *
 * Statistics need every value (quantiles), so finish() keeps one Float64Array per section of
 * finals and hands them to sectionFinalStatistics.
 *
 * Memory O(S) numbers + O(A) buffer; time O(S·A).
 */
import type { Assessment, GradingPlan, Score, Student } from '../model';
import { COUNTED, NOTHING_GRADED, compilePlan, earnedPoints, sectionList, waiverCodes, type CompiledCourse, type CompiledPlan } from './compileCourse';
import { categoryPercent, finishGrades, scratchFor, type FastGrades, type Scratch } from './gradeCompiled';

export interface RowBuffer {
  /** Earned points per assessment (earnedPoints rule: not finite or ≤ 0 → 0). */
  readonly earned: Float64Array;
  /** EARNED | MISSING | EXCUSED | PENDING per assessment. */
  readonly state: Uint8Array;
}

export interface StreamGrader {
  readonly compiled: CompiledPlan;
  /** A buffer to fill for the next row (reused: copy nothing out of it). */
  readonly row: RowBuffer;
  /**
   * Grade the row now in `row` for this student; true when the student has a weighted percent
   * (some counted category with weight), false when there will be no final mark.
   */
  add(student: Student): boolean;
  /** Adjust, round and letter every student added so far. */
  finish(): { course: CompiledCourse; grades: FastGrades };
}

const STATE: Record<Score['kind'], number> = { earned: 0, missing: 1, excused: 2, pending: 3 };

/** Fill a row buffer from Score cells (absent cells are missing). */
export function fillRow(row: RowBuffer, cells: readonly Score[]): void {
  row.state.fill(1);
  row.earned.fill(0);
  const n = Math.min(cells.length, row.state.length);
  for (let a = 0; a < n; a++) {
    const cell = cells[a]!;
    row.state[a] = STATE[cell.kind];
    row.earned[a] = earnedPoints(cell);
  }
}

export function createStreamGrader(assessments: readonly Assessment[], plan: GradingPlan): StreamGrader {
  const compiled = compilePlan(assessments, plan);
  const A = assessments.length;
  const C = compiled.categories.length;
  const row: RowBuffer = { earned: new Float64Array(A), state: new Uint8Array(A) };
  const scratch: Scratch = scratchFor(compiled);
  const codes = new Uint8Array(C);
  let weighted = new Float64Array(1024);
  let has = new Uint8Array(1024);
  let sectionOf = new Int32Array(1024);
  let status = new Uint8Array(1024 * C);
  const students: Student[] = [];
  const { sections, indexOf: sectionIndexOf } = sectionList();

  function grow(): void {
    const size = weighted.length * 2;
    const w = new Float64Array(size);
    w.set(weighted);
    weighted = w;
    const h = new Uint8Array(size);
    h.set(has);
    has = h;
    const s = new Int32Array(size);
    s.set(sectionOf);
    sectionOf = s;
    const st = new Uint8Array(size * C);
    st.set(status);
    status = st;
  }

  return {
    compiled,
    row,
    add(student: Student): boolean {
      const s = students.length;
      if (s === weighted.length) grow();
      students.push(student);
      sectionOf[s] = sectionIndexOf(student.section);
      waiverCodes(compiled, student, codes);
      let num = 0;
      let den = 0;
      for (let c = 0; c < C; c++) {
        status[s * C + c] = codes[c]!;
        if (codes[c] !== COUNTED) continue;
        const p = categoryPercent(compiled.categories[c]!, row.earned, row.state, 0, scratch);
        if (p !== p) {
          status[s * C + c] = NOTHING_GRADED; // the category does not count
          continue;
        }
        const w = compiled.categories[c]!.weight;
        num += w * p;
        den += w;
      }
      has[s] = den > 0 ? 1 : 0;
      weighted[s] = den > 0 ? num / den : Number.NaN;
      return den > 0;
    },
    finish() {
      const S = students.length;
      const course: CompiledCourse = {
        compiled,
        students,
        studentCount: S,
        sections,
        sectionOf: sectionOf.subarray(0, S),
        earned: new Float64Array(0),
        state: new Uint8Array(0),
        waived: new Uint8Array(0),
      };
      const grades: FastGrades = {
        catPercent: new Float64Array(0),
        catStatus: status.subarray(0, S * C),
        weighted: weighted.subarray(0, S),
        hasWeighted: has.subarray(0, S),
        adjusted: new Float64Array(S),
        final: new Float64Array(S),
        letter: new Int32Array(S),
        problems: [],
      };
      finishGrades(course, grades);
      return { course, grades };
    },
  };
}

