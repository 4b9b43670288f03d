import { describe, expect, it } from 'vitest';
import { DEFAULT_SCALE, letterFor, SCALE_PRESETS, sortedCutoffs, validateScale } from '../../../renderer/engine/grading/gradeScale';
import type { GradeScale } from '../../../renderer/engine/model';

// Presets are common practice, no source (see gradeScale.ts); these tests check the rule, not the numbers.

describe('letterFor', () => {
  it('exact boundaries: the minimum is inclusive', () => {
    expect(letterFor(90, DEFAULT_SCALE)?.letter).toBe('A-');
    expect(letterFor(89.99, DEFAULT_SCALE)?.letter).toBe('B+');
    expect(letterFor(97, DEFAULT_SCALE)?.letter).toBe('A+');
    expect(letterFor(100, DEFAULT_SCALE)?.letter).toBe('A+');
    expect(letterFor(120, DEFAULT_SCALE)?.letter).toBe('A+');
    expect(letterFor(60, DEFAULT_SCALE)?.letter).toBe('D-');
    expect(letterFor(59.999, DEFAULT_SCALE)?.letter).toBe('F');
    expect(letterFor(0, DEFAULT_SCALE)?.letter).toBe('F');
  });

  it('every cutoff of every preset: at the minimum it is that letter, just below it is not', () => {
    for (const scale of SCALE_PRESETS) {
      for (const c of scale.cutoffs) {
        expect(letterFor(c.minPercent, scale)).toBe(c);
        if (c.minPercent > 0) expect(letterFor(c.minPercent - 1e-9, scale)?.letter).not.toBe(c.letter);
      }
    }
  });

  it('null below every cutoff; order of the cutoffs does not matter', () => {
    const scale: GradeScale = { name: 't', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'H', minPercent: 85 }] };
    expect(letterFor(49.9, scale)).toBeNull();
    expect(letterFor(-1, DEFAULT_SCALE)).toBeNull();
    expect(letterFor(85, scale)?.letter).toBe('H');
    expect(sortedCutoffs(scale).map((c) => c.letter)).toEqual(['H', 'P']);
  });
});

describe('presets', () => {
  it('are valid, and include letter ± , plain letter, pass/fail and two numeric scales', () => {
    for (const scale of SCALE_PRESETS) expect(validateScale(scale)).toEqual([]);
    expect(SCALE_PRESETS.length).toBeGreaterThanOrEqual(5);
    const letters = (i: number): string[] => SCALE_PRESETS[i]!.cutoffs.map((c) => c.letter);
    expect(letters(0)).toEqual(['A+', 'A', 'A-', 'B+', 'B', 'B-', 'C+', 'C', 'C-', 'D+', 'D', 'D-', 'F']);
    expect(letters(1)).toEqual(['A', 'B', 'C', 'D', 'F']);
    expect(letters(2)).toEqual(['Pass', 'Fail']);
    expect(letterFor(50, SCALE_PRESETS[3]!)?.letter).toBe('4.0');
    expect(letterFor(49, SCALE_PRESETS[3]!)?.passing).toBe(false);
    expect(letterFor(50, SCALE_PRESETS[4]!)?.letter).toBe('10/20');
    expect(letterFor(50, SCALE_PRESETS[4]!)?.passing).toBe(true);
  });
});

describe('validateScale', () => {
  it('reports empty, duplicates, negatives, blank letters and a gap at the bottom', () => {
    expect(validateScale({ name: 'e', cutoffs: [] })[0]).toContain('has no cutoffs');
    const problems = validateScale({
      name: 'bad',
      cutoffs: [
        { letter: 'A', minPercent: 90 },
        { letter: 'a', minPercent: 80 },
        { letter: 'B', minPercent: 80 },
        { letter: ' ', minPercent: 70 },
        { letter: 'Z', minPercent: -5 },
        { letter: 'N', minPercent: Number.NaN },
      ],
    });
    expect(problems.some((p) => p.includes('Letter "a" appears more than once'))).toBe(true);
    expect(problems.some((p) => p.includes('share the minimum 80'))).toBe(true);
    expect(problems.some((p) => p.includes('empty letter'))).toBe(true);
    expect(problems.some((p) => p.includes('negative minimum (-5'))).toBe(true);
    expect(problems.some((p) => p.includes('not a number'))).toBe(true);
    expect(validateScale({ name: 'gap', cutoffs: [{ letter: 'P', minPercent: 50 }] })).toEqual([
      'Finals below 50 % get no letter; add a cutoff at 0 % (for example F) if every student needs one.',
    ]);
  });
});
