/**
 * Fuzz suite of `npm test` (≥ 500 cases): hostile files plus 520 generated ones through the isolated
 * importer. What each case must satisfy is in harness.ts; figures go to
 * tests/artifacts/fuzz-summary.json ("normal").
 */
import { defineFuzzSuite } from './suite';

defineFuzzSuite({ suite: 'normal', generated: 520, caseMillis: 15_000, maxHeapMb: 512, familyMillis: 180_000 });
