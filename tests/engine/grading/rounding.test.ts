import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { roundHalfUp } from '../../../renderer/engine/grading/rounding';
import { letterFor, SCALE_PRESETS } from '../../../renderer/engine/grading/gradeScale';

// Half-up ("round half away from zero") is the school convention — common practice, no source.
// Binary64 facts (IEEE 754): 2.675 is stored as 2.67499999999999982236…, 1.005 as 1.00499999999999989…,
// 0.1 + 0.2 evaluates to 0.30000000000000004 — verifiable with Number.prototype.toPrecision(20).

describe('roundHalfUp', () => {
  it('rounds float sums that fall just short of a tie as the tie (hand-found sum: 3·21.6 + 97·91.6 over 100)', () => {
    const sum = (3 * 21.6 + 97 * 91.6) / 100;
    expect(sum).toBeLessThan(89.5); // the float artefact this rule exists for
    expect(sum.toPrecision(16)).toBe('89.49999999999999');
    expect(roundHalfUp(sum, 0)).toBe(90);
    expect(roundHalfUp(89.49999999999999, 0)).toBe(90);
  });

  it('0.1 + 0.2 rounds to exactly 0.3 at one decimal', () => {
    expect(0.1 + 0.2).not.toBe(0.3);
    expect(roundHalfUp(0.1 + 0.2, 1)).toBe(0.3);
    expect(roundHalfUp(0.1 + 0.2, 2)).toBe(0.3);
  });

  it('rounds the decimal the user typed, not its binary neighbour', () => {
    expect((2.675).toFixed(2)).toBe('2.67'); // what naive rounding gives
    expect(roundHalfUp(2.675, 2)).toBe(2.68);
    expect(roundHalfUp(1.005, 2)).toBe(1.01);
    expect(roundHalfUp(1.045, 2)).toBe(1.05);
    expect(roundHalfUp(8.345, 2)).toBe(8.35);
  });

  it('x.5 goes up, x.45 at 0 decimals goes down, x.45 at 1 decimal goes up', () => {
    expect(roundHalfUp(89.5, 0)).toBe(90);
    expect(roundHalfUp(0.5, 0)).toBe(1);
    expect(roundHalfUp(2.5, 0)).toBe(3); // not banker's rounding
    expect(roundHalfUp(89.45, 0)).toBe(89);
    expect(roundHalfUp(89.45, 1)).toBe(89.5);
    expect(roundHalfUp(89.44, 1)).toBe(89.4);
    expect(roundHalfUp(89.4999, 0)).toBe(89);
    expect(roundHalfUp(89.4999999999, 0)).toBe(89); // genuinely below: 12 significant digits
  });

  it('negative values round half away from zero; zero stays +0', () => {
    expect(roundHalfUp(-2.5, 0)).toBe(-3);
    expect(roundHalfUp(-0.04, 1)).toBe(0);
    expect(Object.is(roundHalfUp(-0.04, 1), 0)).toBe(true);
    expect(Object.is(roundHalfUp(-0, 2), 0)).toBe(true);
  });

  it('large and tiny magnitudes', () => {
    expect(roundHalfUp(123456789.125, 2)).toBe(123456789.13);
    expect(roundHalfUp(1e-20, 2)).toBe(0);
    expect(roundHalfUp(1e25, 2)).toBe(1e25);
    expect(roundHalfUp(0.000125, 5)).toBe(0.00013);
  });

  it('refuses non-finite input and bad decimals', () => {
    expect(() => roundHalfUp(Number.NaN, 0)).toThrow(RangeError);
    expect(() => roundHalfUp(Number.POSITIVE_INFINITY, 0)).toThrow(RangeError);
    expect(() => roundHalfUp(1, 1.5)).toThrow(RangeError);
    expect(() => roundHalfUp(1, -1)).toThrow(RangeError);
  });

  it('property: agrees with exact decimal half-up on values written with d+1 decimals', () => {
    // Oracle: integer arithmetic on the decimal digits (the definition of half-up).
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000 }), fc.integer({ min: 0, max: 4 }), (n, d) => {
        const x = Number(`${n}e-${d + 1}`); // the decimal n / 10^(d+1), as typed
        const q = Math.floor(n / 10);
        const expected = Number(`${n % 10 >= 5 ? q + 1 : q}e-${d}`);
        expect(roundHalfUp(x, d)).toBe(expected);
      }),
    );
  });

  it('property: idempotent, and within half a unit of the input', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 6 }), (x, d) => {
        const r = roundHalfUp(x, d);
        expect(roundHalfUp(r, d)).toBe(r);
        expect(Math.abs(r - x)).toBeLessThanOrEqual(0.5 * 10 ** -d * (1 + 1e-9) + Math.abs(x) * 1e-15);
      }),
    );
  });

  it('every cutoff of every preset: a float sum landing a hair under cutoff − 0.5 still earns the cutoff at 0 decimals', () => {
    for (const scale of SCALE_PRESETS) {
      for (const c of scale.cutoffs) {
        if (c.minPercent === 0) continue;
        const tie = c.minPercent - 0.5;
        const hair = tie - tie * 2 ** -52; // one ulp-ish below, as float sums produce
        expect(hair).toBeLessThan(tie);
        const final = roundHalfUp(hair, 0);
        expect(final).toBe(c.minPercent);
        expect(letterFor(final, scale)?.letter).toBe(c.letter);
        // and a real 0.05 below the tie stays below
        expect(letterFor(roundHalfUp(tie - 0.05, 0), scale)?.letter).not.toBe(c.letter);
      }
    }
  });
});
