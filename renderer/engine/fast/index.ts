/**
 * Fast paths of the engine: the plain grading and statistics rules (grading/, stats/) run over a
 * course compiled into typed arrays, with incremental updates after a weight or score edit. Every
 * function here is property-tested equal to the plain path (tests/engine/fast/); the plain modules
 * remain the specification.
 */
export {
  CATEGORY_STATUSES,
  COUNTED,
  EARNED,
  EXCUSED,
  MISSING,
  NOTHING_GRADED,
  PENDING,
  compileCourse,
  compilePlan,
  earnedPoints,
  setCompiledScore,
  waiverCodes,
} from './compileCourse';
export type { CompiledCategory, CompiledCourse, CompiledPlan } from './compileCourse';
export {
  categoryPercent,
  effectiveWeightsOf,
  emptyGrades,
  finishGrades,
  gradeCompiled,
  onlyWeightsChanged,
  reweigh,
  scratchFor,
  updateScore,
} from './gradeCompiled';
export type { FastGrades, Scratch } from './gradeCompiled';
export { roundHalfUpFast } from './roundHalfUpFast';
export { describeWithSorted, sectionFinalStatistics } from './sectionFinalStatistics';
export type { FinalStatistics, FinalStatisticsOptions, GroupStatistics } from './sectionFinalStatistics';
export { dropForTotalPointsFast, dropLowestPercentsFast, dropScratch } from './dropLowestFast';
export type { DropScratch } from './dropLowestFast';
export { createStreamGrader, fillRow } from './streamGrader';
export type { RowBuffer, StreamGrader } from './streamGrader';
export { planWithout, weightedWithout } from './weightedWithout';
export type { WeightedPercents } from './weightedWithout';
