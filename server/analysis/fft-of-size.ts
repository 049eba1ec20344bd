import FFT from 'fft.js';

/** Transforms are reused: building fft.js's twiddle table costs about as much as one transform. */
const transforms = new Map<number, FFT>();

/**
 * A cached fft.js transform of the given power-of-two size (fft.js 4, radix-4 Cooley–Tukey:
 * Cooley & Tukey 1965, Math. Comp. 19:297–301). At most a handful of sizes are ever used.
 *
 * Cost: O(size) the first time a size is asked for, O(1) afterwards.
 */
export function fftOfSize(size: number): FFT {
  let fft = transforms.get(size);
  if (!fft) {
    fft = new FFT(size);
    transforms.set(size, fft);
  }
  return fft;
}
