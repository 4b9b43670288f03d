/**
 * The score grid is checked cell by cell with isPlainScore and, when any cell is not plainly valid,
 * parsed again by zod's scoreSchema for its issues. So isPlainScore must never accept what
 * scoreSchema refuses (it may refuse more: zod then decides), and must accept every valid cell of
 * the usual shape (else the fast check would never be used). The reference is zod itself.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gradebookSchema, isPlainScore, scoreSchema } from '../../../main/services/schemas';
import { sampleProject } from './sampleProject';

const validScore = fc.oneof(
  fc.record({ kind: fc.constant('earned' as const), points: fc.double({ noNaN: true, noDefaultInfinity: true }) }),
  fc.record({ kind: fc.constantFrom('missing' as const, 'excused' as const, 'pending' as const) }),
);

// Near misses of every sort: wrong or extra keys, wrong value types, odd numbers, odd objects.
const nearMiss = fc.oneof(
  fc.record({ kind: fc.constantFrom('earned', 'missing', 'excused', 'pending', 'late', '', 'EARNED'), points: fc.oneof(fc.double(), fc.string(), fc.constant(undefined), fc.constant(null)) }, { requiredKeys: [] }),
  fc.record({ kind: fc.constantFrom('earned', 'missing'), points: fc.double(), note: fc.string() }),
  fc.dictionary(fc.constantFrom('kind', 'points', '__proto__', 'constructor', 'toString'), fc.anything()),
  fc.anything(),
  validScore.map((s) => Object.assign(Object.create({ inherited: 1 }) as object, s)),
  validScore.map((s) => Object.assign(Object.create(null) as object, s)),
  fc.constant(Object.create({ kind: 'missing' }) as unknown),
  validScore.map((s) => [s]),
);

describe('isPlainScore', () => {
  it('never accepts a value scoreSchema refuses', () => {
    fc.assert(
      fc.property(fc.oneof(validScore, nearMiss), (x) => {
        if (isPlainScore(x)) expect(scoreSchema.safeParse(x).success).toBe(true);
      }),
      { numRuns: 5000 },
    );
  });

  it('accepts every valid cell of the usual shape', () => {
    fc.assert(fc.property(validScore, (x) => isPlainScore(x) && scoreSchema.safeParse(x).success), { numRuns: 2000 });
  });
});

describe('the score grid of gradebookSchema', () => {
  it('gives zod’s own paths and messages when a cell is bad', () => {
    const book = sampleProject().gradebook;
    const scores = book.scores.map((row) => row.map((c) => ({ ...c })));
    (scores[1]![2] as { kind: string }).kind = 'late';
    const r = gradebookSchema.safeParse({ ...book, scores });
    expect(r.success).toBe(false);
    const expected = scoreSchema.safeParse(scores[1]![2]);
    expect(expected.success).toBe(false);
    if (!r.success && !expected.success) {
      expect(r.error.issues.map((i) => i.path)).toEqual([['scores', 1, 2, ...expected.error.issues[0]!.path]]);
      expect(r.error.issues[0]!.message).toBe(expected.error.issues[0]!.message);
    }
  });

  it('accepts the same grids as the zod parse of every cell', () => {
    const cell = fc.oneof({ weight: 9, arbitrary: validScore }, { weight: 1, arbitrary: nearMiss });
    // Rows as wide as the assessments, so the grid's shape rule holds and the cells decide.
    const grid = fc.integer({ min: 1, max: 4 }).chain((width) => fc.array(fc.array(cell, { minLength: width, maxLength: width }), { minLength: 1, maxLength: 4 }).map((scores) => ({ width, scores })));
    fc.assert(
      fc.property(grid, ({ width, scores }) => {
        const assessments = Array.from({ length: width }, (_, a) => ({ id: `a${a}`, name: `A${a}`, possible: 10 }));
        const book = { students: scores.map((_, i) => ({ id: `s${i}`, name: '', section: 'A' })), assessments, scores };
        const cellsValid = scores.every((row) => row.every((c) => scoreSchema.safeParse(c).success));
        expect(gradebookSchema.safeParse(book).success).toBe(cellsValid);
      }),
      { numRuns: 1000 },
    );
  });
});
