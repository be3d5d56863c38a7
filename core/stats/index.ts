// Statistics core: percentiles, robust trend (Theil–Sen + Mann–Kendall), OLS and
// the humidity relation. One concept per file; see each file for formula, units,
// reference and a worked example.
export { assertFiniteValues } from './assertFiniteValues';
export { complementaryErrorFunction } from './complementaryErrorFunction';
export { formatPValue } from './formatPValue';
export { humidityRelation, type HumidityReading, type HumidityRelation, type HumidityExclusions, type HumidityNotEnoughData, type HumidityRelationOptions } from './humidityRelation';
export { kendallS } from './kendallS';
export { kendallVarianceS } from './kendallVarianceS';
export { linearRegression, type LinearRegressionFit } from './linearRegression';
export { logGamma } from './logGamma';
export { mannKendall, type MannKendallResult, type MannKendallOptions, type TrendDirection } from './mannKendall';
export { mean } from './mean';
export { median } from './median';
export { notEnoughData, type NotEnoughData } from './notEnoughData';
export { pairwiseSlopesAtRanks } from './pairwiseSlopesAtRanks';
export { percentile } from './percentile';
export { quantile } from './quantile';
export { quantileSorted } from './quantileSorted';
export { quickselect } from './quickselect';
export { regularizedIncompleteBeta } from './regularizedIncompleteBeta';
export { sampleVariance } from './sampleVariance';
export { standardNormalCdf } from './standardNormalCdf';
export { standardNormalQuantile } from './standardNormalQuantile';
export { studentTTwoSidedPValue } from './studentTTwoSidedPValue';
export { sumCompensated } from './sumCompensated';
export { theilSen, type TheilSenFit, type TheilSenOptions } from './theilSen';
export { tieGroupSizes } from './tieGroupSizes';
export { trendSummary, MS_PER_WEEK, type TrendPoint, type TrendSummary, type TrendSummaryOptions } from './trend';
