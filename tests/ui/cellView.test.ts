// formatPoints (renderer/ui/roster/cellView.ts) keeps formatted values by number; whatever the
// order of calls it must give exactly what Intl.NumberFormat gives for each value (the ECMA-402
// formatter is the reference), -0 ("-0") and 0 ("0") included, though a Map key does not tell
// them apart.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatPoints } from '../../renderer/ui/roster/cellView';

const reference = new Intl.NumberFormat('en', { maximumFractionDigits: 2, useGrouping: false });

describe('formatPoints', () => {
  it('equals Intl.NumberFormat for every value, in any order of calls', () => {
    const value = fc.oneof(
      fc.constantFrom(0, -0, 0.5, 10, 17.5, -3, Number.NaN, Infinity, -Infinity, 1e21, 0.005, 0.015),
      fc.double(),
      fc.integer({ min: -200, max: 400 }).map((n) => n / 2),
    );
    fc.assert(
      fc.property(fc.array(value, { minLength: 1, maxLength: 40 }), (xs) => {
        for (const x of xs) expect(formatPoints(x)).toBe(reference.format(x));
      }),
      { numRuns: 300 },
    );
    expect(formatPoints(0)).toBe('0');
    expect(formatPoints(-0)).toBe('-0');
  });
});
