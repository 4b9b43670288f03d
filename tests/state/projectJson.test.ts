/**
 * The recovery copy's serialisation in steps must be JSON.stringify's text exactly (the reference
 * is the built-in itself), whatever the course holds — including the marker's own text in a name,
 * where it falls back to one step — and runInSlices must finish the work across several tasks and
 * stop when cancelled.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CourseProject } from '../../renderer/bridge/contract';
import type { Score } from '../../renderer/engine/model';
import { projectJsonSteps } from '../../renderer/state/projectJson';
import { runInSlices } from '../../renderer/state/slices';
import { sampleProject } from '../services/project/sampleProject';

function finish<T>(steps: Generator<unknown, T>): { value: T; steps: number } {
  let n = 0;
  for (;;) {
    const next = steps.next();
    if (next.done === true) return { value: next.value, steps: n };
    n++;
  }
}

const scoreArb: fc.Arbitrary<Score> = fc.oneof(
  fc.record({ kind: fc.constant('earned' as const), points: fc.double({ noNaN: true, noDefaultInfinity: true }) }),
  fc.record({ kind: fc.constantFrom('missing' as const, 'excused' as const, 'pending' as const) }),
);

describe('projectJsonSteps', () => {
  it('gives JSON.stringify(project) for random grids, names and step sizes', () => {
    const base = sampleProject();
    fc.assert(
      fc.property(fc.array(fc.array(scoreArb, { maxLength: 5 }), { maxLength: 40 }), fc.string(), fc.integer({ min: 1, max: 17 }), (scores, title, per) => {
        const project: CourseProject = { ...base, title, gradebook: { ...base.gradebook, scores } };
        expect(finish(projectJsonSteps(project, per)).value).toBe(JSON.stringify(project));
      }),
      { numRuns: 500 },
    );
  });

  it('spreads a large grid over many steps', () => {
    const base = sampleProject();
    const scores = Array.from({ length: 1000 }, () => base.gradebook.scores[0]!);
    const project: CourseProject = { ...base, gradebook: { ...base.gradebook, scores } };
    const done = finish(projectJsonSteps(project, 100));
    expect(done.steps).toBe(10);
    expect(done.value).toBe(JSON.stringify(project));
  });

  it('falls back to one step when the course holds the marker text itself', () => {
    const base = sampleProject();
    const project: CourseProject = { ...base, notes: '\u0000weighbridge-score-grid\u0000' };
    const done = finish(projectJsonSteps(project, 1));
    expect(done.value).toBe(JSON.stringify(project));
    expect(done.steps).toBe(0);
  });
});

describe('runInSlices', () => {
  it('finishes the work over several tasks and hands over its value', async () => {
    let starts = 0;
    function* work(): Generator<void, number> {
      let sum = 0;
      for (let i = 1; i <= 50; i++) {
        sum += i;
        yield;
      }
      return sum;
    }
    const value = await new Promise<number>((resolve) => {
      // A slice of 0 ms: one step per task.
      runInSlices(() => {
        starts++;
        return work();
      }, resolve, 0);
    });
    expect(value).toBe(1275);
    expect(starts).toBe(1); // the work is started once and continued, not restarted
  });

  it('stops when cancelled', async () => {
    let steps = 0;
    function* endless(): Generator<void, number> {
      for (;;) {
        steps++;
        yield;
      }
    }
    let finished = false;
    const cancel = runInSlices(endless, () => (finished = true), 0);
    await new Promise((r) => setTimeout(r, 30));
    cancel();
    const seen = steps;
    await new Promise((r) => setTimeout(r, 30));
    expect(steps).toBe(seen);
    expect(seen).toBeGreaterThan(0);
    expect(finished).toBe(false);
  });
});
