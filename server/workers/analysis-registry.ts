import {
  acf,
  acfBands,
  adf,
  arYuleWalker,
  boxPierce,
  ccf,
  channelDiagnostics,
  detectPeriod,
  rangeComparison,
  difference,
  effectiveSampleSize,
  identifyProcess,
  ljungBox,
  pacf,
  periodogram,
  regularize,
} from '../analysis/index.ts';

/**
 * The engine functions a worker may run, by the name a task gives. Adding a function here is
 * all it takes to make it callable through the pool.
 */
export const analysisFunctions = {
  acf,
  pacf,
  acfBands,
  ljungBox,
  boxPierce,
  ccf,
  arYuleWalker,
  difference,
  regularize,
  detectPeriod,
  periodogram,
  effectiveSampleSize,
  adf,
  identifyProcess,
  channelDiagnostics,
  rangeComparison,
};

export type AnalysisFunctions = typeof analysisFunctions;
export type AnalysisFunctionName = keyof AnalysisFunctions;

/** One call for the pool: the function's name and its arguments, typed per function. */
export type AnalysisTask = {
  [K in AnalysisFunctionName]: { fn: K; args: Parameters<AnalysisFunctions[K]> };
}[AnalysisFunctionName];

/** What running `task` returns. */
export type AnalysisResult<T extends AnalysisTask> = ReturnType<AnalysisFunctions[T['fn']]>;
