import { loessTricubeWeights } from './loess-tricube-weights.ts';

/**
 * Tricube weights by distance for a full loess window of odd `span` centred on the fitting
 * position (radius `(span − 1) / 2`), cut to the distances that get weight: the outermost
 * ones get none under the 0.999 cut-off of STL's reference code. Feeds
 * {@link loessSymmetricFit}. Method: Cleveland, Cleveland, McRae & Terpenning (1990),
 * J. Official Statistics 6(1):3–73, §2.1. Cost: O(span).
 */
export function loessSymmetricKernel(span: number): Float64Array {
  const radius = (span - 1) / 2;
  const weights = new Float64Array(radius + 1);
  const reach = loessTricubeWeights(radius, 0, radius, weights);
  return weights.subarray(0, Math.min(reach, radius) + 1);
}
