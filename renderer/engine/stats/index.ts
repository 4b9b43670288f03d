/** Statistics half of the engine: pure functions, each module one statistic or rule. */
export { mean } from './mean';
export { weightedMean } from './weightedMean';
export { sampleVariance, populationVariance } from './variance';
export { sampleSd, populationSd } from './standardDeviation';
export { extent } from './extent';
export { modes } from './modes';
export { coefficientOfVariation } from './coefficientOfVariation';
export { QUANTILE_METHODS, QUANTILE_TYPES, quantile, quantileSorted, type QuantileType } from './quantile';
export { TUKEY_K, tukeyFences, type Outlier, type TukeyFences } from './tukeyFences';
export { describe, type DescribeOptions, type Summary } from './describe';
export { boxPlot, type BoxPlot } from './boxPlot';
export {
  MAX_BINS,
  freedmanDiaconisBinWidth,
  histogram,
  scottBinWidth,
  sturgesBinCount,
  type Bin,
  type BinRule,
  type Histogram,
} from './histogram';
export { ecdf, ecdfAt, ecdfSteps, type Ecdf, type EcdfStep } from './ecdf';
export { SMALL_GROUP_N, hedgesG, kruskalWallis, mannWhitneyU, midRanks, rankSumCounts, smallGroupCaution, welchT } from './compare';
