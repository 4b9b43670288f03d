/**
 * itemAnalysis(): the corrected item–total correlation against its textbook definition, computed
 * here from the raw score matrix with jstat `corrcoeff` (an independent library), and the flags.
 *
 * Textbook definition (classical test theory; e.g. Nunnally & Bernstein 1994 — from memory): the
 * corrected item–total correlation of item i is r(xᵢ, T − xᵢ), T = the total of all items. With
 * every item in one total-points category of equal possible points, the engine's "rest of the
 * weighted mark" is (T − xᵢ)/(possible of the others)·100, a linear function of T − xᵢ, so r must
 * equal the textbook value exactly.
 */
import jStatModule from 'jstat';
import { describe, expect, it } from 'vitest';
import { itemAnalysis, planWithout, VERY_HARD_PERCENT, LOW_DISCRIMINATION } from '../../../renderer/engine/analysis/itemAnalysis';
import type { Defined } from '../../../renderer/engine/defined';
import type { GradingPlan } from '../../../renderer/engine/model';
import { book, category, earned, EXCUSED, MISSING, onePlan, PENDING } from './fixtures';

const jStat = jStatModule as unknown as { corrcoeff(a: number[], b: number[]): number };

function value(d: Defined<number>): number {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

// Five fully scored students on five 10-point items, plus one student who has no earned score on
// any item (so never enters a correlation) but supplies the missing/excused/pending counts.
const raw = [
  [9, 8, 7, 10, 1],
  [7, 6, 8, 10, 2],
  [5, 5, 4, 10, 5],
  [3, 4, 5, 10, 6],
  [8, 9, 9, 10, 0],
];
const b = book(
  [10, 10, 10, 10, 10],
  [
    ...raw.map((r, i) => [`Student ${i + 1}`, 'A', ...r.map(earned)] as [string, string, ...ReturnType<typeof earned>[]]),
    ['Student 6', 'A', MISSING, EXCUSED, PENDING, MISSING, EXCUSED],
  ],
);
const plan = onePlan(b);

describe('itemAnalysis on one total-points category', () => {
  const rows = itemAnalysis(b, plan);

  it('one row per assessment, in gradebook order', () => {
    expect(rows.map((r) => r.assessmentId)).toEqual(['a1', 'a2', 'a3', 'a4', 'a5']);
  });

  for (let i = 0; i < 5; i++) {
    it(`item ${i + 1}: counts, difficulty and SD from the definitions`, () => {
      const row = rows[i]!;
      const item = raw.map((r) => r[i]! * 10); // percent of 10 points
      expect(row.scored).toBe(5);
      expect([row.missing, row.excused, row.pending]).toEqual([[1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 0, 0], [0, 1, 0]][i]);
      // jstat mean / stdev(sample = true) as the independent reference.
      expect(value(row.meanPercent)).toBeCloseTo((jStatModule as unknown as { mean(a: number[]): number }).mean(item), 12);
      if (i !== 3) expect(value(row.sdPercent)).toBeCloseTo((jStatModule as unknown as { stdev(a: number[], s: boolean): number }).stdev(item, true), 12);
    });
  }

  for (const i of [0, 1, 2, 4]) {
    it(`item ${i + 1}: discrimination = r(item, total − item) (textbook), itemTotal = r(item, total) — jstat corrcoeff`, () => {
      const item = raw.map((r) => r[i]!);
      const total = raw.map((r) => r.reduce((s, x) => s + x, 0));
      const rest = total.map((t, k) => t - item[k]!);
      const row = rows[i]!;
      expect(row.pairs).toBe(5);
      expect(value(row.discrimination)).toBeCloseTo(jStat.corrcoeff(item, rest), 12);
      expect(value(row.itemTotal)).toBeCloseTo(jStat.corrcoeff(item, total), 12);
    });
  }

  it('flags follow the stated thresholds of the reference r and mean', () => {
    for (const [i, row] of rows.entries()) {
      const item = raw.map((r) => r[i]!);
      const codes = row.flags.map((f) => f.code);
      const meanPercent = (item.reduce((s, x) => s + x, 0) / item.length) * 10;
      expect(codes.includes('veryHard')).toBe(meanPercent < VERY_HARD_PERCENT);
      if (i === 3) continue; // constant item: r not defined
      const rest = raw.map((r) => r.reduce((s, x) => s + x, 0) - r[i]!);
      const r = jStat.corrcoeff(item, rest);
      expect(codes.includes('negativeDiscrimination')).toBe(r < 0);
      expect(codes.includes('lowDiscrimination')).toBe(r >= 0 && r < LOW_DISCRIMINATION);
    }
  });

  it('item 4 (everyone 10 of 10): all-full-marks flag, discrimination not defined with a reason', () => {
    const row = rows[3]!;
    expect(row.flags.map((f) => f.code)).toEqual(['allFullMarks']);
    expect(row.discrimination.defined).toBe(false);
    if (!row.discrimination.defined) expect(row.discrimination.reason).toMatch(/no spread/);
  });

  it('item 5 (reversed, mean 28 %): negative discrimination and very hard', () => {
    const codes = rows[4]!.flags.map((f) => f.code);
    expect(codes).toContain('negativeDiscrimination');
    expect(codes).toContain('veryHard');
    expect(value(rows[4]!.discrimination)).toBeLessThan(0);
  });
});

describe('itemAnalysis with weighted categories: the rest is the plan recomputed without the item', () => {
  // Category P (weight 60): items a1, a2 of 10 points, total points. Category Q (weight 40): item a3
  // of 20 points. Hand-derived rest marks (current mark, Σ wᶜ·sᶜ / Σ wᶜ over counting categories):
  //   without a1: (60·a2/10 + 40·a3/20)·100/100;  without a3: Q has nothing left and is left out,
  //   so the rest is P alone = (a1 + a2)/20·100.
  const pts = [
    [9, 7, 12],
    [4, 6, 18],
    [8, 8, 10],
    [2, 3, 9],
    [6, 9, 15],
    [10, 4, 20],
  ];
  const wb = book([10, 10, 20], pts.map((r, i) => [`P${i}`, 'A', ...r.map(earned)] as [string, string, ...ReturnType<typeof earned>[]]));
  const wplan: GradingPlan = {
    ...onePlan(wb),
    categories: [category('P', 60), category('Q', 40)],
    items: { a1: { categoryId: 'P', extraCredit: false }, a2: { categoryId: 'P', extraCredit: false }, a3: { categoryId: 'Q', extraCredit: false } },
  };
  const rows = itemAnalysis(wb, wplan);

  it('a1 against 0.6·a2% + 0.4·a3%', () => {
    const item = pts.map((r) => r[0]! * 10);
    const rest = pts.map((r) => 0.6 * r[1]! * 10 + 0.4 * (r[2]! / 20) * 100);
    expect(value(rows[0]!.discrimination)).toBeCloseTo(jStat.corrcoeff(item, rest), 12);
  });

  it('a3 (the only item of Q) against P alone, its category re-normalised away', () => {
    const item = pts.map((r) => (r[2]! / 20) * 100);
    const rest = pts.map((r) => ((r[0]! + r[1]!) / 20) * 100);
    expect(value(rows[2]!.discrimination)).toBeCloseTo(jStat.corrcoeff(item, rest), 12);
  });

  it('planWithout ungrades exactly one item and leaves the plan otherwise untouched', () => {
    const p = planWithout(wplan, 'a2');
    expect(p.items['a2']).toEqual({ categoryId: null, extraCredit: false });
    expect(p.items['a1']).toBe(wplan.items['a1']);
    expect(p.categories).toBe(wplan.categories);
    expect(planWithout(p, 'a2')).toBe(p); // already ungraded: same object
  });
});
