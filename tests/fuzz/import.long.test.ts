/**
 * Long fuzz suite (`npm run test:long`, vitest.long.config.mts): the hostile files at full size
 * and 10 000 generated cases. Bounded in count (10 000 + the hostile list) and in time (each case
 * ≤ 60 s, each family ≤ 20 min). Figures go to tests/artifacts/fuzz-summary.json ("long").
 */
import { defineFuzzSuite } from './suite';

defineFuzzSuite({ suite: 'long', generated: 10_000, caseMillis: 60_000, maxHeapMb: 1024, familyMillis: 1_200_000 });
