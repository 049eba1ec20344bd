/**
 * Smallest power of two ≥ m and ≥ 4 (the smallest size fft.js accepts), the padded length of
 * every transform in the engine.
 *
 * Cost: O(log m).
 */
export function powerOfTwoAtLeast(m: number): number {
  let size = 4;
  while (size < m) size *= 2;
  return size;
}
