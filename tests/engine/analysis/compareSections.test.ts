/**
 * compareSections(): which test is chosen, that it carries the published values through, and the
 * plain-words output. Reference values: REFERENCES.md "Comparing sections".
 */
import { describe, expect, it } from 'vitest';
import { compareSections, effectWords, formatP } from '../../../renderer/engine/analysis/compareSections';

// R dataset `sleep` (Student 1908): published R output of t.test(g1, g2): t = −1.8608,
// df = 17.776, p = 0.07939 [src+lib].
const g1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const g2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
// Hollander & Wolfe (1973) p. 116: H = 0.77143, df = 2, p = 0.68 [src].
const x = [2.9, 3.0, 2.5, 2.6, 3.2];
const y = [3.8, 2.7, 4.0, 2.4];
const z = [2.8, 3.4, 3.7, 2.2, 2.0];

describe('compareSections', () => {
  it('two sections: Welch t with the published values, one pair with Mann–Whitney and Hedges g', () => {
    const c = compareSections([{ section: 'Mon', values: g1 }, { section: 'Thu', values: g2 }]);
    expect(c.overall.kind).toBe('welch');
    if (c.overall.kind !== 'welch' || !c.overall.result.defined) throw new Error('expected a Welch result');
    expect(c.overall.result.value.t).toBeCloseTo(-1.8608, 4);
    expect(c.overall.result.value.df).toBeCloseTo(17.776, 3);
    expect(c.overall.result.value.p).toBeCloseTo(0.07939, 5);
    expect(c.pairs).toHaveLength(1);
    const pair = c.pairs[0]!;
    // Sleep data with ties: W = 25.5, p = 0.06933 (R wilcox.test, normal approx.) [src].
    expect(pair.mannWhitney.defined && pair.mannWhitney.value.w).toBe(25.5);
    expect(pair.mannWhitney.defined && pair.mannWhitney.value.p).toBeCloseTo(0.06933, 5);
    // d = −0.832181 [lib]; Hedges' g ≈ −0.797.
    expect(pair.hedges.defined && pair.hedges.value.d).toBeCloseTo(-0.832181, 6);
    expect(c.sentences[0]).toMatch(/Welch's t test on the means of Mon and Thu: t = -1\.86 with 17\.8 degrees of freedom; a difference like this could easily arise by chance \(p = 0\.079/);
    expect(pair.sentence).toMatch(/Thu is 1\.6 points higher on average/);
    expect(pair.sentence).toMatch(/Hedges' g = -0\.80, a medium difference/); // |g| ≈ 0.797 < 0.8
    expect(c.bonferroniAlpha).toBeNull();
  });

  it('three sections: Kruskal–Wallis with the published H, and all three pairs with a Bonferroni note', () => {
    const c = compareSections([{ section: 'X', values: x }, { section: 'Y', values: y }, { section: 'Z', values: z }]);
    expect(c.overall.kind).toBe('kruskalWallis');
    if (c.overall.kind !== 'kruskalWallis' || !c.overall.result.defined) throw new Error('expected a Kruskal–Wallis result');
    expect(c.overall.result.value.h).toBeCloseTo(0.77143, 5);
    expect(c.overall.result.value.df).toBe(2);
    expect(c.overall.result.value.p).toBeCloseTo(0.68, 2);
    expect(c.pairs.map((p) => `${p.a}-${p.b}`)).toEqual(['X-Y', 'X-Z', 'Y-Z']);
    expect(c.bonferroniAlpha).toBeCloseTo(0.05 / 3, 15);
    expect(c.sentences.join(' ')).toMatch(/do not differ more than chance/);
    expect(c.sentences.join(' ')).toMatch(/0\.05\/3 = 0\.0167 \(Bonferroni\)/);
  });

  it('the caution names small sections by name and always mentions non-random assignment', () => {
    const c = compareSections([{ section: 'X', values: x }, { section: 'Y', values: y }, { section: 'Z', values: z }]);
    expect(c.caution).toMatch(/section X has only 5 students; section Y has only 4 students; section Z has only 5 students/);
    expect(c.caution).toMatch(/not randomly assigned/);
  });

  it('one section: no test, says why', () => {
    const c = compareSections([{ section: 'Only', values: x }]);
    expect(c.overall).toEqual({ kind: 'none', reason: 'there is only one section; nothing to compare' });
    expect(c.pairs).toEqual([]);
  });

  it('a section with one student: Welch and g not defined, reasons in the words', () => {
    const c = compareSections([{ section: 'A', values: [70] }, { section: 'B', values: [60, 80, 75] }]);
    expect(c.overall.kind === 'welch' && c.overall.result.defined).toBe(false);
    expect(c.sentences[0]).toMatch(/not possible: first group/);
    expect(c.pairs[0]!.sentence).toMatch(/No effect size/);
  });

  it("effect words at Cohen's conventional 0.2 / 0.5 / 0.8 boundaries; p formatting", () => {
    expect([0.19, 0.2, 0.49, 0.5, 0.79, 0.8, -0.85].map(effectWords)).toEqual(['negligible', 'small', 'small', 'medium', 'medium', 'large', 'large']);
    expect(formatP(0.0004)).toBe('p < 0.001');
    expect(formatP(0.0381)).toBe('p = 0.038');
  });
});
