import { describe, expect, it } from 'vitest';
import { categoryScore, type CategoryItem } from '../../../renderer/engine/grading/categoryScore';
import type { Score } from '../../../renderer/engine/model';
import { category, E, EXC, MISS, PEND } from './helpers';

// Expected values are hand arithmetic from the definitions in categoryScore.ts
// (total points = Σe/Σp, equal items = mean of e/p; extra credit numerator-only — common practice, no source).

const items = (cells: readonly [number, Score, boolean?][]): CategoryItem[] =>
  cells.map(([possible, score, extraCredit], i) => ({ assessmentId: `a${i}`, possible, score, extraCredit: extraCredit ?? false }));

const pct = (r: ReturnType<typeof categoryScore>): number => {
  if (!r.percent.defined) throw new Error(r.percent.reason);
  return r.percent.value;
};

describe('categoryScore', () => {
  it('total points vs equal items', () => {
    const cells = items([[10, E(5)], [40, E(40)]]);
    // total: 45/50 = 90 %; equal: (50 % + 100 %)/2 = 75 %
    expect(pct(categoryScore(category('q', 1), cells, 'current'))).toBeCloseTo(90, 12);
    expect(pct(categoryScore(category('q', 1, { combine: 'equalItems' }), cells, 'current'))).toBeCloseTo(75, 12);
  });

  it('excused is never counted nor dropped; missing is zero or left out per category', () => {
    const cells = items([[10, E(8)], [10, EXC], [10, MISS]]);
    const zero = categoryScore(category('q', 1), cells, 'current');
    expect(pct(zero)).toBeCloseTo(40, 12); // 8/20
    expect(zero.lines.map((l) => l.status)).toEqual(['counted', 'excused', 'missingZero']);
    expect(zero.lines.map((l) => l.earned)).toEqual([8, null, 0]);
    const excluded = categoryScore(category('q', 1, { missingAs: 'excluded' }), cells, 'current');
    expect(pct(excluded)).toBeCloseTo(80, 12); // 8/10
    expect(excluded.lines.map((l) => l.status)).toEqual(['counted', 'excused', 'missingExcluded']);
    // drop 1 with an excused item present: the excused one is not "used up" by the drop
    const dropped = categoryScore(category('q', 1, { dropLowest: 1 }), cells, 'current');
    expect(dropped.lines.map((l) => l.status)).toEqual(['counted', 'excused', 'dropped']);
    expect(pct(dropped)).toBeCloseTo(80, 12);
  });

  it('pending: left out in the current mark, zero in the projected final', () => {
    const cells = items([[10, E(9)], [10, PEND]]);
    const current = categoryScore(category('q', 1), cells, 'current');
    expect(pct(current)).toBeCloseTo(90, 12);
    expect(current.lines[1]!.status).toBe('pendingExcluded');
    const projected = categoryScore(category('q', 1), cells, 'projected');
    expect(pct(projected)).toBeCloseTo(45, 12);
    expect(projected.lines[1]!.status).toBe('pendingZero');
    expect(projected.lines[1]!.earned).toBe(0);
  });

  it('nothing graded: not defined, even when extra credit was earned', () => {
    const r = categoryScore(category('q', 1), items([[10, PEND], [10, EXC], [5, E(5), true]]), 'current');
    expect(r.percent.defined).toBe(false);
    expect(r.lines.map((l) => l.status)).toEqual(['pendingExcluded', 'excused', 'extraCredit']);
    expect(categoryScore(category('q', 1), [], 'projected').percent.defined).toBe(false);
  });

  it('extra credit adds to the numerator only (total points)', () => {
    // (8 + 9 + 3) / (10 + 10) = 100 %; the bonus adds 3/20 = 15 points of percent
    const cells = items([[10, E(8)], [10, E(9)], [5, E(3), true]]);
    const r = categoryScore(category('q', 1), cells, 'current');
    expect(pct(r)).toBeCloseTo(100, 12);
    expect(r.lines[2]).toMatchObject({ status: 'extraCredit', earned: 3, possible: 5 });
  });

  it('extra credit under equal items: bonus points as a percent of the kept total possible', () => {
    // quizzes 5/10 and 20/40: mean 50 %; bonus 10 points over Σp = 50 adds 20 → 70 %
    const cells = items([[10, E(5)], [40, E(20)], [10, E(10), true]]);
    expect(pct(categoryScore(category('q', 1, { combine: 'equalItems' }), cells, 'current'))).toBeCloseTo(70, 12);
    // with equal possible the two rules agree: (6 + 8)/20 + 2/20 = 80 %
    const same = items([[10, E(6)], [10, E(8)], [4, E(2), true]]);
    expect(pct(categoryScore(category('q', 1, { combine: 'equalItems' }), same, 'current'))).toBeCloseTo(80, 12);
    expect(pct(categoryScore(category('q', 1), same, 'current'))).toBeCloseTo(80, 12);
  });

  it('missing or pending extra credit adds nothing and is never a zero in the denominator', () => {
    const cells = items([[10, E(8)], [5, MISS, true], [5, PEND, true]]);
    const r = categoryScore(category('q', 1), cells, 'projected');
    expect(pct(r)).toBeCloseTo(80, 12);
    expect(r.lines.map((l) => l.status)).toEqual(['counted', 'missingExcluded', 'pendingExcluded']);
  });

  it('cap is applied after extra credit', () => {
    const cells = items([[10, E(10)], [10, E(9)], [5, E(4), true]]); // (19 + 4)/20 = 115 %
    const r = categoryScore(category('q', 1, { capPercent: 100 }), cells, 'current');
    expect(pct(r)).toBe(100);
    expect(r.capped).toBe(true);
    expect(r.uncappedPercent).toEqual({ defined: true, value: 115 });
    const below = categoryScore(category('q', 1, { capPercent: 100 }), items([[10, E(7)]]), 'current');
    expect(below.capped).toBe(false);
    expect(pct(below)).toBeCloseTo(70, 12);
  });

  it('drop lowest: Kane & Kane (2006) example through the category, extra credit never dropped', () => {
    // Kane & Kane (2006), Mathematics Magazine 79(3) [from memory]: 20/100, 0/2, 10/10 drop 1 → 10/12
    const cells = items([[100, E(20)], [2, E(0)], [10, E(10)], [5, E(0), true]]);
    const r = categoryScore(category('q', 1, { dropLowest: 1 }), cells, 'current');
    expect(r.dropped).toBe(1);
    expect(r.lines.map((l) => l.status)).toEqual(['dropped', 'counted', 'counted', 'extraCredit']);
    expect(pct(r)).toBeCloseTo((100 * 10) / 12, 12);
    // the dropped line keeps its points so the explanation can show what was dropped
    expect(r.lines[0]).toMatchObject({ earned: 20, percent: 20 });
  });

  it('drop lowest under equal items drops the lowest percents; a missing zero is dropped first', () => {
    const cells = items([[10, E(6)], [10, MISS], [20, E(10)], [10, E(9)]]);
    const r = categoryScore(category('q', 1, { combine: 'equalItems', dropLowest: 2 }), cells, 'current');
    expect(r.lines.map((l) => l.status)).toEqual(['counted', 'dropped', 'dropped', 'counted']);
    expect(pct(r)).toBeCloseTo(75, 12); // (60 + 90)/2
  });

  it('projected: a pending item counted as zero can be the one dropped', () => {
    const cells = items([[10, E(6)], [10, E(8)], [10, PEND]]);
    const r = categoryScore(category('q', 1, { dropLowest: 1 }), cells, 'projected');
    expect(r.lines.map((l) => l.status)).toEqual(['counted', 'counted', 'dropped']);
    expect(pct(r)).toBeCloseTo(70, 12);
  });
});
