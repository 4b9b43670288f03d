/**
 * Fast grading of a compiled course (compileCourse.ts): the same pipeline as gradeCourse.ts —
 * category percents → re-normalised weighted percent → adjustments → rounding → letter — as tight
 * loops over typed arrays, reproducing the plain engine's numbers EXACTLY (same operations in the
 * same order, so the same doubles; property-tested in tests/engine/fast/).
 *
 * What is kept where (FastGrades, all index-aligned, updated in place by the incremental calls):
 *   catPercent[s·C + c]  category percent after cap (NaN when the category does not count)
 *   catStatus[s·C + c]   CATEGORY_STATUSES code (counted, waived…, nothingGraded)
 *   weighted[s], hasWeighted[s], adjusted[s], final[s] (NaN = no mark), letter[s] (cutoff index, −1 none)
 *
 * Incremental design — only work whose inputs changed is redone:
 *   - weight edit (reweigh): category percents do not depend on weights, so only the weighting
 *     (Σ wᶜ·sᶜ / Σ wᶜ over the cached percents, O(S·C)), the adjustments and the rounding run;
 *   - score edit (updateScore): only the categories holding that assessment are recomputed for
 *     that one student, then their weighted percent; the final step (adjustments + rounding +
 *     letter) runs for that student alone, unless a scale-to-mean adjustment makes every final
 *     depend on the group mean — then the final step (O(S), no category work) runs for everyone.
 *     The mean is recomputed rather than patched so the sum keeps the plain engine's order (and
 *     therefore its exact value).
 *
 * Drop lowest makes the plain dropLowest.ts choice: in doubles when that is provably exact
 * (dropLowestFast.ts — points in hundredths, small sums), else by calling the plain BigInt functions.
 */
import type { GradingPlan, Score } from '../model';
import { dropCount, dropForTotalPoints, dropLowestPercents, type DropCandidate } from '../grading/dropLowest';
import {
  COUNTED,
  NOTHING_GRADED,
  compilePlan,
  setCompiledScore,
  type CompiledCategory,
  type CompiledCourse,
  type CompiledPlan,
} from './compileCourse';
import {
  CHECK_HALVES,
  HALVES_EXACT,
  dropForTotalPointsFast,
  dropLowestPercentsFast,
  dropScratch,
  halvesBoundHolds,
  isHalfOrWhole,
  type DropScratch,
} from './dropLowestFast';
import { roundHalfUpFast } from './roundHalfUpFast';

export interface FastGrades {
  readonly catPercent: Float64Array;
  readonly catStatus: Uint8Array;
  readonly weighted: Float64Array;
  readonly hasWeighted: Uint8Array;
  readonly adjusted: Float64Array;
  readonly final: Float64Array;
  readonly letter: Int32Array;
  /** Adjustments that could not be applied (same words as the plain engine). */
  problems: readonly string[];
}

/** Reusable buffers for one category's candidates (no allocation per student). */
export interface Scratch {
  readonly earned: Float64Array;
  readonly possible: Float64Array;
  readonly drop: DropScratch;
}

export function scratchFor(compiled: CompiledPlan): Scratch {
  const most = Math.max(1, ...compiled.categories.map((c) => c.items.length));
  return { earned: new Float64Array(most), possible: new Float64Array(most), drop: dropScratch(most) };
}

/**
 * One category percent (categoryScore.ts) for the row starting at `base`; NaN when nothing is
 * graded. A category with no assessments is 0 in the projected final (gradeCourse's noColumns rule).
 *
 * Which cells enter is the compiled `counts` table (one lookup per cell). Extra credit adds its
 * earned points whatever the cell's state: compiled earned points are 0 for every state but
 * earned, and adding +0 leaves a sum of non-negative numbers unchanged, so the sum is the plain one.
 * Without drop-lowest the sums run straight over the row (multiplying by the table's 0 or 1 rather
 * than branching, when every possible is positive); with it the counted cells are gathered first
 * (the drop choice needs them side by side).
 */
export function categoryPercent(cat: CompiledCategory, earned: Float64Array, state: Uint8Array, base: number, scratch: Scratch): number {
  if (cat.items.length === 0) return cat.emptyPercent;
  const ex = cat.extra;
  let extra = 0;
  for (let j = 0; j < ex.length; j++) extra += earned[base + ex[j]!]!;
  const reg = cat.regular;
  const pos = cat.regularPossible;
  const counts = cat.counts;
  const m = reg.length;
  let sumE = 0;
  let sumP = 0;
  let sumPct = 0;
  let kept = 0;
  if (!(cat.dropLowest > 0) && cat.possibleAllPositive) {
    // Branch-free (CompiledCategory.possibleAllPositive): c is 1 or 0, and x·1 = x, x·0 = 0,
    // s + 0 = s exactly for the non-negative sums here, so the sums are the branching loop's.
    if (cat.totalPoints) {
      for (let j = 0; j < m; j++) {
        const cell = base + reg[j]!;
        const c = counts[state[cell]!]!;
        sumE += earned[cell]! * c;
        sumP += pos[j]! * c;
        kept += c;
      }
    } else {
      for (let j = 0; j < m; j++) {
        const cell = base + reg[j]!;
        const c = counts[state[cell]!]!;
        const p = pos[j]!;
        sumP += p * c;
        sumPct += ((100 * earned[cell]!) / p) * c;
        kept += c;
      }
    }
    if (kept === 0) return Number.NaN;
  } else if (!(cat.dropLowest > 0)) {
    if (cat.totalPoints) {
      for (let j = 0; j < m; j++) {
        const cell = base + reg[j]!;
        if (counts[state[cell]!] === 1) {
          sumE += earned[cell]!;
          sumP += pos[j]!;
          kept++;
        }
      }
    } else {
      for (let j = 0; j < m; j++) {
        const cell = base + reg[j]!;
        if (counts[state[cell]!] === 1) {
          const p = pos[j]!;
          sumP += p;
          sumPct += (100 * earned[cell]!) / p;
          kept++;
        }
      }
    }
    if (kept === 0) return Number.NaN;
  } else {
    const ce = scratch.earned;
    const cp = scratch.possible;
    let n = 0;
    // Gathered with dropLowestFast's halves test on the way (HalvesCheck), saving it a pass.
    let halves = true;
    let absE = 0;
    let allP = 0;
    for (let j = 0; j < m; j++) {
      const cell = base + reg[j]!;
      if (counts[state[cell]!] === 1) {
        const e = earned[cell]!;
        const p = pos[j]!;
        ce[n] = e;
        cp[n] = p;
        n++;
        if (!isHalfOrWhole(e) || !isHalfOrWhole(p) || !(p > 0)) halves = false;
        absE += Math.abs(e);
        allP += p;
      }
    }
    if (n === 0) return Number.NaN;
    kept = n;
    const drops = dropCount(n, cat.dropLowest);
    const ds = scratch.drop;
    const check = halves && halvesBoundHolds(absE, allP) ? HALVES_EXACT : CHECK_HALVES;
    if (
      drops > 0 &&
      (cat.totalPoints ? dropForTotalPointsFast(ce, cp, n, cat.dropLowest, ds, check) : dropLowestPercentsFast(ce, cp, n, cat.dropLowest, ds, check))
    ) {
      kept = n - drops;
      const dropped = ds.dropped;
      if (cat.totalPoints) {
        for (let i = 0; i < n; i++) {
          if (dropped[i] === 1) continue;
          sumE += ce[i]!;
          sumP += cp[i]!;
        }
      } else {
        for (let i = 0; i < n; i++) {
          if (dropped[i] === 1) continue;
          sumP += cp[i]!;
          sumPct += (100 * ce[i]!) / cp[i]!;
        }
      }
    } else if (drops > 0) {
      // Points too fine or too large for exact double products: the plain BigInt choice.
      const candidates: DropCandidate[] = [];
      for (let i = 0; i < n; i++) candidates.push({ earned: ce[i]!, possible: cp[i]! });
      const choice = cat.totalPoints ? dropForTotalPoints(candidates, cat.dropLowest) : dropLowestPercents(candidates, cat.dropLowest);
      kept = choice.kept.length;
      for (const i of choice.kept) {
        sumE += ce[i]!;
        sumP += cp[i]!;
        sumPct += (100 * ce[i]!) / cp[i]!;
      }
    } else {
      for (let i = 0; i < n; i++) {
        sumE += ce[i]!;
        sumP += cp[i]!;
        sumPct += (100 * ce[i]!) / cp[i]!;
      }
    }
  }
  const baseline = cat.totalPoints ? (100 * sumE) / sumP : sumPct / kept;
  const uncapped = baseline + (100 * extra) / sumP;
  return cat.hasCap && uncapped > cat.cap ? cat.cap : uncapped;
}

export function emptyGrades(course: CompiledCourse): FastGrades {
  const S = course.studentCount;
  const C = course.compiled.categories.length;
  return {
    catPercent: new Float64Array(S * C),
    catStatus: new Uint8Array(S * C),
    weighted: new Float64Array(S),
    hasWeighted: new Uint8Array(S),
    adjusted: new Float64Array(S),
    final: new Float64Array(S),
    letter: new Int32Array(S),
    problems: [],
  };
}

/** Category percents of student s into the grades (statuses from the waivers, then nothing graded). */
function scoreStudent(course: CompiledCourse, grades: FastGrades, s: number, scratch: Scratch): void {
  const { compiled, earned, state, waived } = course;
  const C = compiled.categories.length;
  const base = s * compiled.assessmentCount;
  for (let c = 0; c < C; c++) {
    const k = s * C + c;
    const status = waived[k]!;
    if (status !== COUNTED) {
      grades.catStatus[k] = status;
      grades.catPercent[k] = Number.NaN;
      continue;
    }
    const p = categoryPercent(compiled.categories[c]!, earned, state, base, scratch);
    grades.catStatus[k] = p === p ? COUNTED : NOTHING_GRADED;
    grades.catPercent[k] = p;
  }
}

/** Σ wᶜ·sᶜ / Σ wᶜ over the counted categories (renormalise.ts weightedPercent), from the cache. */
function weighStudent(compiled: CompiledPlan, grades: FastGrades, s: number): void {
  const C = compiled.categories.length;
  let num = 0;
  let den = 0;
  for (let c = 0; c < C; c++) {
    const k = s * C + c;
    if (grades.catStatus[k] !== COUNTED) continue;
    const w = compiled.categories[c]!.weight;
    num += w * grades.catPercent[k]!;
    den += w;
  }
  const ok = den > 0;
  grades.hasWeighted[s] = ok ? 1 : 0;
  grades.weighted[s] = ok ? num / den : Number.NaN;
}

/** Rounding (once, half-up) and letter of student s from grades.adjusted. */
function roundStudent(compiled: CompiledPlan, grades: FastGrades, s: number): void {
  const x = grades.adjusted[s]!;
  if (grades.hasWeighted[s] !== 1 || !Number.isFinite(x)) {
    grades.final[s] = Number.NaN;
    grades.letter[s] = -1;
    return;
  }
  const final = roundHalfUpFast(x, compiled.decimals);
  grades.final[s] = final;
  const cutoffs = compiled.cutoffs;
  let letter = -1;
  for (let i = 0; i < cutoffs.length; i++) {
    if (cutoffs[i]!.minPercent <= final) {
      letter = i;
      break;
    }
  }
  grades.letter[s] = letter;
}

/** Index of the plan's section name in course.sections, −1 for the whole course, −2 for none. */
function groupIndex(course: CompiledCourse, section: string | null): number {
  if (section === null) return -1;
  const k = course.sections.indexOf(section);
  return k < 0 ? -2 : k;
}

function groupName(section: string | null): string {
  return section === null ? 'the whole course' : `section ${section}`;
}

/**
 * adjustments.ts on typed arrays: every adjustment in list order over its group; scale-to-mean
 * uses the group's mean before the step, summed in roster order as the plain engine does.
 */
function adjustAll(course: CompiledCourse, grades: FastGrades): void {
  const S = course.studentCount;
  const { adjusted, weighted, hasWeighted } = grades;
  adjusted.set(weighted);
  const problems: string[] = [];
  course.compiled.plan.adjustments.forEach((adj, step) => {
    const g = groupIndex(course, adj.section);
    const inGroup = (s: number): boolean => g === -1 || course.sectionOf[s] === g;
    const parameter = adj.kind === 'addPoints' ? adj.points : adj.kind === 'cap' ? adj.maxPercent : adj.targetMean;
    if (!Number.isFinite(parameter)) {
      problems.push(`Adjustment ${step + 1} (${adj.kind} for ${groupName(adj.section)}) was not applied: its value is not a number.`);
      return;
    }
    if (g === -2) {
      if (adj.kind === 'scaleToMean') {
        problems.push(
          `Adjustment ${step + 1} (scale to mean ${adj.targetMean} for ${groupName(adj.section)}) was not applied: the group has no marks.`,
        );
      }
      return;
    }
    if (adj.kind === 'addPoints') {
      for (let s = 0; s < S; s++) if (hasWeighted[s] === 1 && inGroup(s)) adjusted[s] = adjusted[s]! + adj.points;
    } else if (adj.kind === 'cap') {
      for (let s = 0; s < S; s++) if (hasWeighted[s] === 1 && inGroup(s)) adjusted[s] = Math.min(adjusted[s]!, adj.maxPercent);
    } else {
      let sum = 0;
      let count = 0;
      for (let s = 0; s < S; s++) {
        if (hasWeighted[s] === 1 && inGroup(s)) {
          sum += adjusted[s]!;
          count++;
        }
      }
      const mean = sum / count;
      if (count === 0 || !(mean > 0)) {
        problems.push(
          `Adjustment ${step + 1} (scale to mean ${adj.targetMean} for ${groupName(adj.section)}) was not applied: ` +
            `the group has ${count === 0 ? 'no marks' : 'a mean of 0'}.`,
        );
        return;
      }
      const factor = adj.targetMean / mean;
      for (let s = 0; s < S; s++) if (hasWeighted[s] === 1 && inGroup(s)) adjusted[s] = adjusted[s]! * factor;
    }
  });
  grades.problems = problems;
}

/** Adjustments of one student when no adjustment depends on the group (no scale-to-mean). */
function adjustOne(course: CompiledCourse, grades: FastGrades, s: number): void {
  let x = grades.weighted[s]!;
  if (grades.hasWeighted[s] === 1) {
    for (const adj of course.compiled.plan.adjustments) {
      const g = groupIndex(course, adj.section);
      if (g === -2 || (g >= 0 && course.sectionOf[s] !== g)) continue;
      if (adj.kind === 'addPoints' && Number.isFinite(adj.points)) x = x + adj.points;
      else if (adj.kind === 'cap' && Number.isFinite(adj.maxPercent)) x = Math.min(x, adj.maxPercent);
    }
  }
  grades.adjusted[s] = x;
}

/** Adjustments, rounding and letters for every student from grades.weighted (the final step). */
export function finishGrades(course: CompiledCourse, grades: FastGrades): void {
  finishAll(course, grades);
}

function finishAll(course: CompiledCourse, grades: FastGrades): void {
  adjustAll(course, grades);
  for (let s = 0; s < course.studentCount; s++) roundStudent(course.compiled, grades, s);
}

/** Full recompute: every student's category percents, weighted percent, adjustments, final, letter. */
export function gradeCompiled(course: CompiledCourse, into: FastGrades = emptyGrades(course)): FastGrades {
  const scratch = scratchFor(course.compiled);
  for (let s = 0; s < course.studentCount; s++) {
    scoreStudent(course, into, s, scratch);
    weighStudent(course.compiled, into, s);
  }
  finishAll(course, into);
  return into;
}

/** True when `next` differs from the compiled plan in category weights only. */
export function onlyWeightsChanged(previous: GradingPlan, next: GradingPlan): boolean {
  const strip = (p: GradingPlan): string => JSON.stringify({ ...p, categories: p.categories.map((c) => ({ ...c, weight: 0 })) });
  return previous.categories.length === next.categories.length && strip(previous) === strip(next);
}

/**
 * A new plan that changes only category weights: re-weigh from the cached category percents, then
 * adjust and round. Returns the course compiled with the new plan (scores shared, not copied).
 * @throws {Error} when the plans differ in anything but weights (use compileCourse + gradeCompiled)
 */
export function reweigh(course: CompiledCourse, grades: FastGrades, plan: GradingPlan): CompiledCourse {
  if (!onlyWeightsChanged(course.compiled.plan, plan)) {
    throw new Error('reweigh: the new plan changes more than category weights; compile and grade the course again');
  }
  const prev = course.compiled;
  const fresh = compilePlan([], plan);
  const compiled: CompiledPlan = {
    ...prev,
    plan,
    categories: prev.categories.map((c, i) => ({ ...c, weight: fresh.categories[i]!.weight })),
  };
  const next: CompiledCourse = { ...course, compiled };
  for (let s = 0; s < next.studentCount; s++) weighStudent(compiled, grades, s);
  finishAll(next, grades);
  return next;
}

/** One score edit: that student's affected categories, weighted percent and final step only. */
export function updateScore(course: CompiledCourse, grades: FastGrades, student: number, assessment: number, score: Score): void {
  setCompiledScore(course, student, assessment, score);
  const { compiled } = course;
  const C = compiled.categories.length;
  const base = student * compiled.assessmentCount;
  const scratch = scratchFor(compiled);
  for (let c = 0; c < C; c++) {
    const cat = compiled.categories[c]!;
    const k = student * C + c;
    if (course.waived[k] !== COUNTED || !cat.items.includes(assessment)) continue;
    const p = categoryPercent(cat, course.earned, course.state, base, scratch);
    grades.catStatus[k] = p === p ? COUNTED : NOTHING_GRADED;
    grades.catPercent[k] = p;
  }
  weighStudent(compiled, grades, student);
  if (compiled.plan.adjustments.some((a) => a.kind === 'scaleToMean')) {
    finishAll(course, grades);
  } else {
    adjustOne(course, grades, student);
    roundStudent(compiled, grades, student);
  }
}

/** Effective weights of student s (renormalise.ts): 100·wᶜ / Σ w over counted categories, else 0. */
export function effectiveWeightsOf(course: CompiledCourse, grades: FastGrades, s: number): Record<string, number> {
  const { categories } = course.compiled;
  const C = categories.length;
  let total = 0;
  for (let c = 0; c < C; c++) if (grades.catStatus[s * C + c] === COUNTED) total += categories[c]!.weight;
  const out: Record<string, number> = {};
  categories.forEach((cat, c) => {
    out[cat.id] = total > 0 && grades.catStatus[s * C + c] === COUNTED ? (100 * cat.weight) / total : 0;
  });
  return out;
}
