/**
 * The two thresholds of STL's reference code (netlib stl.f, used by R's stats::stl): 0.999 and
 * 0.001 of a radius or scale. stl.f writes them as default-real (single precision) literals
 * that are promoted to double, so these are the single-precision values; with them the
 * boundary cases fall on the same side as in R.
 */
export const CUTOFF_HIGH = Math.fround(0.999);
export const CUTOFF_LOW = Math.fround(0.001);
