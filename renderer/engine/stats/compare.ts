/**
 * Section comparison: tests of difference, effect size and the small-group caution.
 * Each rule lives in its own module (formula + source in its doc comment).
 */
export { welchT } from './welchT';
export { mannWhitneyU, rankSumCounts } from './mannWhitneyU';
export { kruskalWallis } from './kruskalWallis';
export { hedgesG } from './hedgesG';
export { SMALL_GROUP_N, smallGroupCaution } from './smallGroupCaution';
export { midRanks } from './ranks';
