/**
 * Grade scales: ordered cutoffs (letter, minimum percent, optional grade points).
 *
 *   letterFor(x) = the cutoff with the highest minPercent such that minPercent ≤ x; none if x is
 *   below every cutoff. Applied to the ROUNDED final, so 89.5 rounded to 90 earns the 90 cutoff.
 *
 * Presets are starting points — common practice, no source; every institution publishes its own
 * scale and the instructor must check against it. National scales are simplified mappings.
 */
import type { GradeCutoff, GradeScale } from '../model';

const cut = (letter: string, minPercent: number, gradePoints: number, passing: boolean): GradeCutoff => ({
  letter,
  minPercent,
  gradePoints,
  passing,
});

/** A+ … F with 4.0-scale grade points (A+ = 4.0); D− and above pass. Common practice, no source. */
const LETTER_PLUS_MINUS: GradeScale = {
  name: 'Letter grades with + and −',
  cutoffs: [
    cut('A+', 97, 4.0, true),
    cut('A', 93, 4.0, true),
    cut('A-', 90, 3.7, true),
    cut('B+', 87, 3.3, true),
    cut('B', 83, 3.0, true),
    cut('B-', 80, 2.7, true),
    cut('C+', 77, 2.3, true),
    cut('C', 73, 2.0, true),
    cut('C-', 70, 1.7, true),
    cut('D+', 67, 1.3, true),
    cut('D', 63, 1.0, true),
    cut('D-', 60, 0.7, true),
    cut('F', 0, 0, false),
  ],
};

/** A–F at 90/80/70/60, 4/3/2/1/0 points. Common practice, no source. */
const LETTER_PLAIN: GradeScale = {
  name: 'Letter grades A–F',
  cutoffs: [cut('A', 90, 4, true), cut('B', 80, 3, true), cut('C', 70, 2, true), cut('D', 60, 1, true), cut('F', 0, 0, false)],
};

/** Pass at 60 % — a frequent threshold, not a rule; edit to the institution's own. */
const PASS_FAIL: GradeScale = {
  name: 'Pass / fail (pass at 60 %)',
  cutoffs: [
    { letter: 'Pass', minPercent: 60, passing: true },
    { letter: 'Fail', minPercent: 0, passing: false },
  ],
};

/**
 * German-style 1.0 (best) … 4.0 (lowest pass), 5.0 fail, pass at 50 % and a step every 5 %.
 * A simplified linear mapping in common use; institutions set their own thresholds. Grade points
 * hold the numeric grade (lower is better).
 */
const GERMAN_STYLE: GradeScale = {
  name: 'Numeric 1.0–5.0 (German-style, simplified)',
  cutoffs: (
    [
      ['1.0', 95, 1.0],
      ['1.3', 90, 1.3],
      ['1.7', 85, 1.7],
      ['2.0', 80, 2.0],
      ['2.3', 75, 2.3],
      ['2.7', 70, 2.7],
      ['3.0', 65, 3.0],
      ['3.3', 60, 3.3],
      ['3.7', 55, 3.7],
      ['4.0', 50, 4.0],
    ] as const
  )
    .map(([letter, min, grade]) => cut(letter, min, grade, true))
    .concat([cut('5.0', 0, 5.0, false)]),
};

/**
 * French-style marks out of 20: mark n for n × 5 % (whole marks), pass at 10/20. Simplified: real
 * marks out of 20 are usually kept with decimals rather than banded.
 */
const OUT_OF_20: GradeScale = {
  name: 'Marks out of 20 (French-style, simplified)',
  cutoffs: Array.from({ length: 21 }, (_, i) => 20 - i).map((n) => cut(`${n}/20`, n * 5, n, n >= 10)),
};

export const SCALE_PRESETS: readonly GradeScale[] = [LETTER_PLUS_MINUS, LETTER_PLAIN, PASS_FAIL, GERMAN_STYLE, OUT_OF_20];

/** The default for new plans. */
export const DEFAULT_SCALE: GradeScale = LETTER_PLUS_MINUS;

/** Cutoffs by minPercent, highest first (stable: equal minimums keep their listed order). */
export function sortedCutoffs(scale: GradeScale): readonly GradeCutoff[] {
  return scale.cutoffs
    .map((c, i) => ({ c, i }))
    .sort((a, b) => b.c.minPercent - a.c.minPercent || a.i - b.i)
    .map((x) => x.c);
}

export function letterFor(finalPercent: number, scale: GradeScale): GradeCutoff | null {
  for (const c of sortedCutoffs(scale)) if (c.minPercent <= finalPercent) return c;
  return null;
}

/** Problems that make a scale unusable or surprising; empty when the scale is fine. */
export function validateScale(scale: GradeScale): string[] {
  const problems: string[] = [];
  if (scale.cutoffs.length === 0) return [`Grade scale "${scale.name}" has no cutoffs; add at least one letter with a minimum percent.`];
  const letters = new Map<string, number>();
  const minimums = new Map<number, string>();
  for (const c of scale.cutoffs) {
    const letter = c.letter.trim();
    if (letter === '') problems.push(`A cutoff at ${c.minPercent} % has an empty letter; give it a name.`);
    else if (letters.has(letter.toLowerCase())) problems.push(`Letter "${letter}" appears more than once; each letter needs one cutoff.`);
    letters.set(letter.toLowerCase(), c.minPercent);
    if (!Number.isFinite(c.minPercent)) {
      problems.push(`Letter "${letter}" has a minimum that is not a number (${c.minPercent}).`);
      continue;
    }
    if (c.minPercent < 0) problems.push(`Letter "${letter}" has a negative minimum (${c.minPercent} %); minimums start at 0.`);
    const other = minimums.get(c.minPercent);
    if (other !== undefined) problems.push(`Letters "${other}" and "${letter}" share the minimum ${c.minPercent} %; each minimum must differ.`);
    else minimums.set(c.minPercent, letter);
    if (c.gradePoints !== undefined && !Number.isFinite(c.gradePoints)) {
      problems.push(`Letter "${letter}" has grade points that are not a number.`);
    }
  }
  const lowest = Math.min(...scale.cutoffs.map((c) => c.minPercent).filter(Number.isFinite));
  if (Number.isFinite(lowest) && lowest > 0) {
    problems.push(`Finals below ${lowest} % get no letter; add a cutoff at 0 % (for example F) if every student needs one.`);
  }
  return problems;
}
