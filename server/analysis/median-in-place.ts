/**
 * Rearranges `a[0 .. n-1]` so that `a[k]` holds the value of rank k, smaller-or-equal values
 * before it and greater-or-equal after (Hoare's FIND, CACM 4(7):321–322, 1961), and returns it.
 */
function selectInPlace(a: Float64Array, k: number, n: number): number {
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] < a[lo]) swap(a, mid, lo);
    if (a[hi] < a[lo]) swap(a, hi, lo);
    if (a[hi] < a[mid]) swap(a, hi, mid);
    const pivot = a[mid];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * The exact median of `a[0 .. n-1]` (the mean of the two middle values for an even count), by
 * selection instead of a sort: Hoare's FIND (Hoare 1961, Comm. ACM 4(7):321–322) places the
 * upper middle value, and for an even count the lower one is the largest value left of it.
 * Rearranges `a[0 .. n-1]`; the values must not be NaN. NaN when n = 0.
 *
 * Cost: O(n) expected time, no extra space.
 */
export function medianInPlace(a: Float64Array, n: number): number {
  if (n <= 0) return NaN;
  const upper = n >> 1;
  const upperValue = selectInPlace(a, upper, n);
  if (n % 2) return upperValue;
  // After selection every value left of `upper` is at most a[upper].
  let lowerValue = -Infinity;
  for (let i = 0; i < upper; i++) if (a[i] > lowerValue) lowerValue = a[i];
  return (lowerValue + upperValue) / 2;
}
