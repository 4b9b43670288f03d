import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { renormalise, waiverStatus, weightedPercent } from '../../../renderer/engine/grading/renormalise';
import type { CategoryStatus } from '../../../renderer/engine/results';
import { category } from './helpers';

// Re-normalisation: final = Σ wᶜ·sᶜ / Σ wᶜ over counted categories — the weighted arithmetic mean,
// common practice, no source. The properties below follow from that definition.

const statuses: CategoryStatus[] = ['counted', 'droppedForCourse', 'waivedForSection', 'waivedForStudent', 'nothingGraded'];
const input = fc.array(
  fc.record({
    weight: fc.double({ min: 0.01, max: 100, noNaN: true }),
    status: fc.constantFrom(...statuses),
    score: fc.double({ min: 0, max: 120, noNaN: true }),
  }),
  { minLength: 1, maxLength: 8 },
);

describe('renormalise', () => {
  it('hand example: weights 20/30/60 with the 30 waived → 20/80, 0, 60/80 = 25/0/75', () => {
    const r = renormalise([
      { weight: 20, status: 'counted' },
      { weight: 30, status: 'waivedForStudent' },
      { weight: 60, status: 'counted' },
    ]);
    expect(r.defined && r.value).toEqual([25, 0, 75]);
  });

  it('not defined when nothing counts or the counted weights are 0', () => {
    expect(renormalise([{ weight: 10, status: 'nothingGraded' }]).defined).toBe(false);
    expect(renormalise([]).defined).toBe(false);
    expect(renormalise([{ weight: 0, status: 'counted' }]).defined).toBe(false);
    expect(renormalise([{ weight: -5, status: 'counted' }, { weight: 5, status: 'counted' }])).toEqual({ defined: true, value: [0, 100] });
  });

  it('property: effective weights of counted categories sum to 100, others are 0', () => {
    fc.assert(
      fc.property(input, (cats) => {
        const r = renormalise(cats);
        const any = cats.some((c) => c.status === 'counted');
        expect(r.defined).toBe(any);
        if (!r.defined) return;
        expect(r.value.reduce((s, w) => s + w, 0)).toBeCloseTo(100, 10);
        cats.forEach((c, i) => {
          if (c.status !== 'counted') expect(r.value[i]).toBe(0);
        });
      }),
    );
  });

  it('property: waiving a category leaves the ratios between the other weights unchanged', () => {
    fc.assert(
      fc.property(input, fc.nat(), (cats, pick) => {
        const all = cats.map((c) => ({ ...c, status: 'counted' as const }));
        if (all.length < 3) return;
        const k = pick % all.length;
        const waived = all.map((c, i) => (i === k ? { ...c, status: 'waivedForSection' as const } : c));
        const a = renormalise(all);
        const b = renormalise(waived);
        if (!a.defined || !b.defined) throw new Error('expected defined');
        const others = all.map((_, i) => i).filter((i) => i !== k);
        const [i, j] = [others[0]!, others[1]!];
        expect(b.value[i]! / b.value[j]!).toBeCloseTo(a.value[i]! / a.value[j]!, 10);
        expect(b.value[i]! / b.value[j]!).toBeCloseTo(all[i]!.weight / all[j]!.weight, 10);
      }),
    );
  });

  it('property: the weighted percent lies between the lowest and highest counted category score', () => {
    fc.assert(
      fc.property(input, (cats) => {
        const percents = cats.map((c) => (c.status === 'counted' ? c.score : null));
        const w = weightedPercent(cats, percents);
        const counted = cats.filter((c) => c.status === 'counted').map((c) => c.score);
        expect(w.defined).toBe(counted.length > 0);
        if (!w.defined) return;
        expect(w.value).toBeGreaterThanOrEqual(Math.min(...counted) - 1e-9);
        expect(w.value).toBeLessThanOrEqual(Math.max(...counted) + 1e-9);
        // and equals Σ eff·s / 100 with the effective weights
        const eff = renormalise(cats);
        if (!eff.defined) throw new Error('expected defined');
        const viaEff = cats.reduce((s, c, i) => s + (c.status === 'counted' ? (eff.value[i]! * c.score) / 100 : 0), 0);
        expect(viaEff).toBeCloseTo(w.value, 9);
      }),
    );
  });
});

describe('waiverStatus', () => {
  const sw = [{ section: 'B', categoryId: 'labs' }];
  const stw = [{ studentId: 's9', categoryId: 'labs' }];
  it('course drop before section waiver before student waiver', () => {
    expect(waiverStatus(category('labs', 10, { droppedForCourse: true }), { id: 's9', section: 'B' }, sw, stw)).toBe('droppedForCourse');
    expect(waiverStatus(category('labs', 10), { id: 's9', section: 'B' }, sw, stw)).toBe('waivedForSection');
    expect(waiverStatus(category('labs', 10), { id: 's9', section: 'A' }, sw, stw)).toBe('waivedForStudent');
    expect(waiverStatus(category('labs', 10), { id: 's1', section: 'A' }, sw, stw)).toBe('counted');
    expect(waiverStatus(category('quiz', 10), { id: 's9', section: 'B' }, sw, stw)).toBe('counted');
  });
});
