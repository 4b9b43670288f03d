/**
 * One fuzz suite: the hostile constructions one test each, then every generated family through
 * fast-check. Shared by the normal suite (import.test.ts) and the long one (import.long.test.ts).
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { hostileCases } from './cases';
import { FAMILIES, runsFor } from './families';
import { FuzzRunner, writeSummary, type FuzzCase } from './harness';

/** fast-check prints a failing case with this, not as a dump of every byte. */
function labelled(c: FuzzCase): FuzzCase {
  return Object.defineProperty({ ...c }, fc.toStringMethod, {
    value: () => `${c.family} (${c.detail ?? ''}) ${c.fileName}, ${c.bytes.length} bytes`,
    enumerable: false,
  });
}

export interface SuiteConfig {
  readonly suite: 'normal' | 'long';
  /** Generated cases in total, spread over the families by weight. */
  readonly generated: number;
  /** The per-case bound: a call still running then is stopped and the case fails as a hang. */
  readonly caseMillis: number;
  readonly maxHeapMb: number;
  /** Bound on one vitest test (a whole family), so the suite ends even on a slow machine. */
  readonly familyMillis: number;
}

export function defineFuzzSuite(config: SuiteConfig): void {
  // Built once per suite file; a few seconds (10 MB cells, deflated zips).
  const hostile = hostileCases(config.suite);
  const runner = new FuzzRunner({ caseMillis: config.caseMillis, maxHeapMb: config.maxHeapMb, compareDirect: true });

  afterAll(async () => {
    await runner.close();
    writeSummary(config.suite, runner.tally, {
      generatedCases: config.generated,
      hostileCases: hostile.length,
      caseMillisLimit: config.caseMillis,
      workerHeapMb: config.maxHeapMb,
    });
  });

  describe(`hostile files (${config.suite})`, () => {
    it.each(hostile.map((c) => [`${c.family}: ${c.fileName}`, c] as const))('%s', async (_name, c) => {
      const report = await runner.run(c);
      expect(report.defects).toEqual([]);
    }, config.familyMillis);
  });

  describe(`generated files (${config.suite})`, () => {
    it.each(FAMILIES.map((f) => [`${f.name} × ${runsFor(f, config.generated)}`, f] as const))('%s', async (_name, family) => {
      await fc.assert(
        fc.asyncProperty(family.arbitrary.map(labelled), async (c) => {
          const report = await runner.run(c);
          expect(report.defects, `${c.family} (${c.detail ?? ''}): ${c.fileName}`).toEqual([]);
        }),
        { numRuns: runsFor(family, config.generated), endOnFailure: true },
      );
    }, config.familyMillis);
  });
}
