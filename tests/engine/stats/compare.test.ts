/**
 * Section comparison — REFERENCES.md "Comparing sections": Welch (1947)/Satterthwaite (1946) on
 * Student's sleep data (published R output), Mann–Whitney on Hollander & Wolfe (1973) Example 4.1
 * and on the sleep data with ties (R output), Kruskal–Wallis on Hollander & Wolfe (1973) p. 116;
 * cross-checked with @stdlib/stats-ttest2 0.2.3 and @stdlib/stats-kruskal-test 0.2.3.
 */
import kruskalTest from '@stdlib/stats-kruskal-test';
import ttest2 from '@stdlib/stats-ttest2';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Defined } from '../../../renderer/engine/defined';
import { hedgesG, kruskalWallis, mannWhitneyU, rankSumCounts, smallGroupCaution, welchT } from '../../../renderer/engine/stats';

function value<T>(d: Defined<T>): T {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

// R dataset `sleep` (Student 1908): extra hours of sleep, group 1 and group 2.
const sleep1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const sleep2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe("Welch's t (Welch 1947; Satterthwaite 1946)", () => {
  it('sleep data: t = −1.8608, df = 17.776, p = 0.07939 (R t.test output)', () => {
    const r = value(welchT(sleep1, sleep2));
    expect(r.t).toBeCloseTo(-1.8608, 4);
    expect(r.df).toBeCloseTo(17.776, 3);
    expect(r.p).toBeCloseTo(0.07939, 5);
    expect(r.meanDifference).toBeCloseTo(0.75 - 2.33, 12);
  });

  it('agrees with @stdlib/stats-ttest2 (Welch by default): t = −1.860813467, df = 17.77647352', () => {
    const ours = value(welchT(sleep1, sleep2));
    const theirs = ttest2(sleep1, sleep2);
    expect(ours.t).toBeCloseTo(-1.860813467, 9);
    expect(ours.df).toBeCloseTo(17.77647352, 8);
    expect(ours.t).toBeCloseTo(theirs.statistic, 12);
    expect(ours.df).toBeCloseTo(theirs.df, 10);
    // jstat and @stdlib use different incomplete-beta codes; they agree to about 1e-10.
    expect(ours.p).toBeCloseTo(theirs.pValue, 8);
  });

  it('property (fast-check): agrees with @stdlib/stats-ttest2 on random groups', () => {
    // Marks with two decimals, 0–100.
    const group = fc.array(fc.integer({ min: 0, max: 10000 }).map((v) => v / 100), { minLength: 2, maxLength: 40 });
    fc.assert(
      fc.property(group, group, (a, b) => {
        const ours = welchT(a, b);
        if (!ours.defined) return; // zero variance in both groups: stdlib returns NaN there
        const theirs = ttest2(a, b);
        expect(Math.abs(ours.value.t - theirs.statistic)).toBeLessThanOrEqual(1e-8 * Math.max(1, Math.abs(theirs.statistic)));
        // The two libraries' t CDFs (jstat vs @stdlib incomplete beta) differ by up to ~1e-8;
        // p-values are reported to 4 digits, so 1e-6 is ample.
        expect(Math.abs(ours.value.p - theirs.pValue)).toBeLessThanOrEqual(1e-6);
      }),
      { numRuns: 200 },
    );
  });

  it('tiny variances do not underflow into a NaN df (found by fast-check)', () => {
    // s₂²/n₂ ≈ 2.5e−324: its square underflows to 0; df must still be n₂ − 1 = 1.
    const r = value(welchT([0, 0], [0, 3.1434555694052576e-162]));
    expect(r.df).toBe(1);
    expect(Number.isFinite(r.t) && Number.isFinite(r.p)).toBe(true);
  });

  it('not defined for n < 2 or zero variance in both groups', () => {
    expect(welchT([1], [1, 2]).defined).toBe(false);
    expect(welchT([1, 2], []).defined).toBe(false);
    expect(welchT([3, 3], [4, 4]).defined).toBe(false);
    expect(() => welchT([1, 2], [3, Number.NaN])).toThrow(/welchT: value at index 1 is NaN/);
    expect(() => hedgesG([Number.POSITIVE_INFINITY, 2], [3, 4])).toThrow(/hedgesG: value at index 0/);
    expect(() => kruskalWallis([[1], [Number.NaN]])).toThrow(/kruskalWallis \(group 2\)/);
  });
});

describe('Mann–Whitney U / Wilcoxon rank-sum (Hollander & Wolfe 1973; R wilcox.test)', () => {
  const x = [0.8, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46];
  const y = [1.15, 0.88, 0.9, 0.74, 1.21];

  it('H&W Example 4.1: W = 35, exact two-sided p = 0.2544', () => {
    const r = value(mannWhitneyU(x, y));
    expect(r.w).toBe(35);
    expect(r.u).toBe(15);
    expect(r.method).toBe('exact');
    expect(r.p).toBeCloseTo(0.2544, 4);
  });

  it('swapping the samples gives W = n₁n₂ − W and the same p', () => {
    const r = value(mannWhitneyU(y, x));
    expect(r.w).toBe(50 - 35);
    expect(r.p).toBeCloseTo(value(mannWhitneyU(x, y)).p, 14);
  });

  it('sleep data with ties: normal approximation with tie and continuity correction, W = 25.5, p = 0.06933', () => {
    const r = value(mannWhitneyU(sleep1, sleep2));
    expect(r.method).toBe('normal');
    expect(r.w).toBe(25.5);
    expect(r.p).toBeCloseTo(0.06933, 5);
  });

  it('exact distribution equals brute-force enumeration of rank subsets (n₁ = 4, n₂ = 5)', () => {
    // Definition check: every size-4 subset of ranks 1…9 is equally likely under H₀.
    const counts = new Array<number>(4 * 5 + 1).fill(0);
    for (let mask = 0; mask < 1 << 9; mask++) {
      let bits = 0;
      let sum = 0;
      for (let r = 1; r <= 9; r++) {
        if (mask & (1 << (r - 1))) {
          bits++;
          sum += r;
        }
      }
      if (bits === 4) counts[sum - 10] = (counts[sum - 10] as number) + 1;
    }
    expect(rankSumCounts(4, 5)).toEqual(counts);
    expect(counts.reduce((s, c) => s + c, 0)).toBe(126); // C(9, 4)
  });

  it('not defined for an empty group or all values equal', () => {
    expect(mannWhitneyU([], [1]).defined).toBe(false);
    expect(mannWhitneyU([2, 2], [2, 2, 2]).defined).toBe(false);
    expect(() => mannWhitneyU([Number.NaN], [1])).toThrow(/mannWhitneyU/);
  });
});

describe('Kruskal–Wallis (Kruskal & Wallis 1952; Hollander & Wolfe 1973 p. 116)', () => {
  const groups = [
    [2.9, 3.0, 2.5, 2.6, 3.2],
    [3.8, 2.7, 4.0, 2.4],
    [2.8, 3.4, 3.7, 2.2, 2.0],
  ];

  it('H = 0.77143, df = 2, p ≈ 0.68; @stdlib/stats-kruskal-test p = 0.6799648', () => {
    const r = value(kruskalWallis(groups));
    expect(r.h).toBeCloseTo(0.77143, 5);
    expect(r.df).toBe(2);
    expect(r.p).toBeCloseTo(0.68, 2);
    expect(r.p).toBeCloseTo(0.6799648, 7);
    const theirs = kruskalTest(groups[0] as number[], groups[1] as number[], groups[2] as number[]);
    expect(r.h).toBeCloseTo(theirs.statistic, 10);
    expect(r.p).toBeCloseTo(theirs.pValue, 10);
  });

  it('with ties (sleep data as two groups) agrees with @stdlib/stats-kruskal-test', () => {
    const r = value(kruskalWallis([sleep1, sleep2]));
    const theirs = kruskalTest(sleep1, sleep2);
    expect(r.h).toBeCloseTo(theirs.statistic, 10);
    expect(r.p).toBeCloseTo(theirs.pValue, 10);
  });

  it('not defined for < 2 groups, an empty group or all values equal', () => {
    expect(kruskalWallis([[1, 2]]).defined).toBe(false);
    const empty = kruskalWallis([[1, 2], []]);
    expect(empty).toEqual({ defined: false, reason: 'group 2 has no values' });
    expect(kruskalWallis([[5, 5], [5]]).defined).toBe(false);
  });
});

describe("Hedges' g (Hedges 1981)", () => {
  it('sleep data: d = −0.832181 [lib]; g with the exact J and the 1 − 3/(4df − 1) approximation', () => {
    const r = value(hedgesG(sleep1, sleep2));
    expect(r.d).toBeCloseTo(-0.832181, 6);
    expect(r.df).toBe(18);
    // Exact J(18) = Γ(9) / (√9 · Γ(8.5)), Γ(8.5) = (15!!/2⁸)·√π, 15!! = 2027025 — closed form by hand.
    const jExact = 40320 / (3 * (2027025 / 256) * Math.sqrt(Math.PI));
    expect(r.j).toBeCloseTo(jExact, 12);
    expect(r.g).toBeCloseTo(r.d * jExact, 12);
    // REFERENCES.md: g ≈ −0.79702 with the approximation J ≈ 1 − 3/71.
    expect(r.gApprox).toBeCloseTo(-0.79702, 5);
  });

  it('not defined for n < 2 or zero pooled SD', () => {
    expect(hedgesG([1], [1, 2, 3]).defined).toBe(false);
    expect(hedgesG([2, 2], [3, 3]).defined).toBe(false);
  });
});

describe('smallGroupCaution (threshold n < 20: common practice, no source)', () => {
  it('names each small section and always notes that sections are not randomly assigned', () => {
    const c = smallGroupCaution([12, 30, 1]);
    expect(c).toMatch(/section 1 has only 12 students/);
    expect(c).toMatch(/section 3 has only 1 student\b/);
    expect(c).not.toMatch(/section 2/);
    expect(c).toMatch(/not randomly assigned/);
    const big = smallGroupCaution([25, 40]);
    expect(big).not.toMatch(/Small groups/);
    expect(big).toMatch(/not randomly assigned/);
    expect(smallGroupCaution([])).toBeNull();
  });

  it('uses the section names when given', () => {
    const c = smallGroupCaution([12, 30, 1], ['A01', 'A02', 'A03']);
    expect(c).toMatch(/section A01 has only 12 students/);
    expect(c).toMatch(/section A03 has only 1 student\b/);
    expect(c).not.toMatch(/A02/);
  });
});
