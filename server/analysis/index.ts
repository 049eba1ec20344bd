/**
 * Lagbook's numeric engine: pure functions on numeric arrays (NaN marks a missing value), with
 * the short names the rest of the server uses. Nothing here imports from the rest of the server.
 */
export { AnalysisInputError, type AnalysisInputDetail, type AnalysisInputReason, type Series } from './analysis-input-error.ts';
export { autocorrelation as acf, type AutocorrelationOptions } from './autocorrelation.ts';
export { partialAutocorrelation as pacf, type PartialAutocorrelationOptions } from './partial-autocorrelation.ts';
export { autocorrelationBands as acfBands, type AutocorrelationBands, type AutocorrelationBandsOptions } from './autocorrelation-bands.ts';
export { ljungBox } from './ljung-box.ts';
export { boxPierce } from './box-pierce.ts';
export type { PortmanteauOptions, PortmanteauResult } from './portmanteau-test.ts';
export { fitArma, type FitArmaOptions, type FitArmaResult } from './fit-arma.ts';
export { forecastArma, type ArmaForecast, type ArmaModel } from './arma-forecast.ts';
export { armaCrossingChance, type CrossingChance, type CrossingChanceOptions } from './arma-crossing-chance.ts';
export { integratedArmaForecast } from './integrated-arma-forecast.ts';
export { selectArma, type ArmaCandidate, type SelectArmaOptions, type SelectArmaResult } from './select-arma.ts';
export { crossCorrelation as ccf, type CrossCorrelationOptions, type CrossCorrelationResult } from './cross-correlation.ts';
export { arYuleWalker, type ArYuleWalkerOptions, type ArYuleWalkerResult } from './ar-yule-walker.ts';
export { difference, type DifferenceOptions } from './difference.ts';
export { regularize, type RegularizeAggregate, type RegularizeOptions, type RegularizedSeries } from './regularize.ts';
export { detectPeriod, type DetectPeriodOptions, type DetectPeriodResult, type PeriodCandidate } from './detect-period.ts';
export { periodogram, type PeriodogramResult } from './periodogram.ts';
export { effectiveSampleSize, type EffectiveSampleSizeOptions, type EffectiveSampleSizeResult } from './effective-sample-size.ts';
export { trendTest, type TrendTestOptions, type TrendTestResult } from './trend-test.ts';
export { prewhitenedCcf, type PrewhitenedCcfOptions, type PrewhitenedCcfResult, type PrewhitenedCcfStrongest } from './prewhitened-ccf.ts';
export { compareMeans, type CompareMeansOptions, type CompareMeansResult, type MeanDifferenceTest, type RangeMeanSummary } from './compare-means.ts';
export { augmentedDickeyFuller as adf, type AugmentedDickeyFullerOptions, type AugmentedDickeyFullerResult } from './augmented-dickey-fuller.ts';
export {
  identifyProcess,
  type IdentifyProcessOptions,
  type ProcessIdentification,
  type ProcessEvidence,
  type ProcessVerdict,
  type ProcessModelFit,
} from './identify-process.ts';
export { describeModel, NEAR_UNIT_ROOT } from './identify-process-explanation.ts';
export { describeDuration } from './describe-duration.ts';
export { readingsPerIndependent } from './readings-per-independent.ts';
export { rangeComparison, type RangeComparisonOptions } from './range-comparison.ts';
export { andrewsBartlettLag } from './andrews-bartlett-lag.ts';
export { durbinLevinson, type DurbinLevinsonResult } from './durbin-levinson.ts';
export { decomposeClassical } from './decompose-classical.ts';
export { stl } from './stl.ts';
export { thinForDrawing, type ThinForDrawingOptions, type ThinnedCells } from './thin-for-drawing.ts';
export { channelDiagnostics, type ChannelDiagnostics, type ChannelDiagnosticsOptions, type ChannelReadings } from './channel-diagnostics.ts';
