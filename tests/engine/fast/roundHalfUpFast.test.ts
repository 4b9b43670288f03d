/**
 * roundHalfUpFast must return roundHalfUp's double exactly (Object.is), including at and near
 * ties, where it defers to the plain rule. The plain rule is checked against its worked values
 * (89.49999999999999 → 90, 2.675 → 2.68) in tests/engine/grading/rounding.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roundHalfUp } from '../../../renderer/engine/grading/rounding';
import { roundHalfUpFast } from '../../../renderer/engine/fast';

const decimalsArb = fc.integer({ min: 0, max: 6 });

/** Values on, one ulp beside and a few ulps beside a tie k + ½ at d decimals. */
const nearTieArb = fc.tuple(fc.integer({ min: 0, max: 10_000_000 }), decimalsArb, fc.integer({ min: -3, max: 3 })).map(([k, d, ulps]) => {
  let x = (k + 0.5) / 10 ** d;
  for (let i = 0; i < Math.abs(ulps); i++) x = ulps > 0 ? nextUp(x) : nextDown(x);
  return { x, d };
});

function nextUp(x: number): number {
  const b = new Float64Array([x]);
  const u = new BigUint64Array(b.buffer);
  u[0]! += 1n;
  return b[0]!;
}
function nextDown(x: number): number {
  const b = new Float64Array([x]);
  const u = new BigUint64Array(b.buffer);
  u[0]! -= 1n;
  return b[0]!;
}

describe('roundHalfUpFast equals roundHalfUp', () => {
  it('on worked values', () => {
    for (const [x, d] of [
      [89.49999999999999, 0],
      [2.675, 2],
      [0.1 + 0.2, 1],
      [89.5, 0],
      [1e-300, 2],
      [0, 0],
      [-2.5, 0],
      [1e17, 3],
    ] as const) {
      expect(Object.is(roundHalfUpFast(x, d), roundHalfUp(x, d)), `${x} at ${d}`).toBe(true);
    }
  });

  it('on random doubles', () => {
    fc.assert(
      fc.property(fc.double({ min: -200, max: 1e6, noNaN: true, noDefaultInfinity: true }), decimalsArb, (x, d) => {
        expect(Object.is(roundHalfUpFast(x, d), roundHalfUp(x, d))).toBe(true);
      }),
      { numRuns: 8_000 },
    );
  });

  it('at and near ties', () => {
    fc.assert(
      fc.property(nearTieArb, ({ x, d }) => {
        expect(Object.is(roundHalfUpFast(x, d), roundHalfUp(x, d))).toBe(true);
      }),
      { numRuns: 8_000 },
    );
  });

  it('on float sums of decimal marks (the kind weighting produces)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 10_000 }), { minLength: 1, maxLength: 12 }), decimalsArb, (cents, d) => {
        const x = cents.reduce((s, c) => s + c / 100, 0) / cents.length;
        expect(Object.is(roundHalfUpFast(x, d), roundHalfUp(x, d))).toBe(true);
      }),
      { numRuns: 8_000 },
    );
  });

  it('throws as the plain rule does on bad input', () => {
    expect(() => roundHalfUpFast(Number.NaN, 0)).toThrow(RangeError);
    expect(() => roundHalfUpFast(1, 1.5)).toThrow(RangeError);
    expect(() => roundHalfUpFast(1, 21)).toThrow(RangeError);
  });
});
