/** Analysis half of the engine: statistics per section, item analysis and section comparison. */
export { measureValues, sectionsOf, describeLeftOut, leftOutTotal, LEFT_OUT_WORDS } from './measure';
export type { Measure, MeasureValues, Observation, LeftOutCount, LeftOutReason } from './measure';
export { sectionStatistics, outlierStudents } from './sectionStatistics';
export type { SectionStatistics, SectionStatisticsOptions, SectionSummary, OutlierStudent } from './sectionStatistics';
export { pearson, MIN_PAIRS } from './correlation';
export { itemAnalysis, itemAnalysisSteps, planWithout, LOW_DISCRIMINATION, VERY_HARD_PERCENT } from './itemAnalysis';
export type { ItemAnalysis, ItemFlag, ItemFlagCode } from './itemAnalysis';
export { compareSections, comparisonSteps, effectWords, formatP, ALPHA } from './compareSections';
export type { SectionComparison, SectionGroup, PairComparison, OverallTest } from './compareSections';
export { runSteps } from './steps';
