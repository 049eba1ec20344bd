import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { arAutocorrelations } from './ar-autocorrelations.ts';
import { arSpectrum } from './ar-spectrum.ts';
import { autocorrelation } from './autocorrelation.ts';
import { autocorrelationFromPeriodogram } from './autocorrelation-from-periodogram.ts';
import { calendarPeriodNear } from './calendar-period-near.ts';
import { type CalendarName, type CalendarPeriod, calendarPeriods, dayMultiples, dayParts } from './calendar-periods.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { integerOption } from './integer-option.ts';
import { normalQuantile } from './normal-quantile.ts';
import { periodogram } from './periodogram.ts';
import { removeLinearTrend } from './remove-linear-trend.ts';

export interface DetectPeriodOptions {
  /** Longest period considered, in samples; default ⌊n/2⌋ (two full cycles must fit). */
  maxPeriod?: number;
  /** False-alarm level for a series without any cycle (default 0.01). */
  alpha?: number;
  /**
   * Grid step in milliseconds. When given, the hour, day and week that are whole numbers of
   * steps (2..maxPeriod) are tested as calendar periods, and a cycle found within one Fourier
   * bin of one of them is reported as exactly that many steps.
   */
  stepMs?: number;
}

export interface PeriodCandidate {
  /** Period in samples: the calendar period when `calendar` is set, else the rounded raw estimate. */
  period: number;
  /** Raw estimate before rounding or calendar snapping, from the interpolated spectral peak. */
  exactPeriod: number;
  /** The calendar period this candidate was snapped to (within one Fourier bin), or null. */
  calendar: CalendarName | null;
  /** Sample autocorrelation of the detrended series at `period`. */
  acf: number;
  /** Autocorrelation at `period` that the fitted AR background alone implies (persistence, not a cycle). */
  backgroundAcf: number;
  /** Bartlett's band for the ACF at `period` under the AR background (wider than `band` for a persistent series). */
  acfBand: number;
  /** Periodogram ordinate over the AR background spectrum there (≈ Exp(1) without a cycle). */
  peakRatio: number;
  /** Order of the AR background fitted for this candidate (its harmonics removed first). */
  backgroundOrder: number;
  /**
   * Chance of a ratio this large among the frequencies tested in a series without cycles:
   * corrected over the grid searched, or over the calendar periods for a calendar candidate,
   * and doubled when both families are tested (Bonferroni over the two).
   */
  pValue: number;
  /**
   * Which views support it: the periodogram always, the ACF when it exceeds the background's ACF
   * by `acfBand`, `harmonics` when the cycle's own harmonics 2f…4f stand out over the background
   * (a cycle that is not a pure sine puts power there).
   */
  sources: ('periodogram' | 'acf' | 'harmonics')[];
  /**
   * pValue < alpha, and — for a candidate repeating fewer than 6 times in the record — ACF
   * support, or harmonic support with at least 3 repetitions and an ACF above the background's;
   * never for a harmonic of another candidate (`harmonicOf`).
   */
  significant: boolean;
  /**
   * The longer candidate this one is a harmonic of (its frequency within one Fourier bin of k
   * times that candidate's, k = 2…4, with the longer one spectrally significant and repeating
   * better in the ACF), or null. A harmonic is part of that cycle's shape, not a cycle of its own.
   */
  harmonicOf: number | null;
  /** One sentence on how the period was obtained, e.g. "288 steps = 1 day (raw estimate 289.4, …)". */
  note: string;
}

export interface DetectPeriodResult {
  /** The most credible period in samples (calendar-snapped where that applies), or null when no cycle stands out. */
  best: number | null;
  /** Candidates, significant ones first, then by ACF beyond the background's. */
  candidates: PeriodCandidate[];
  /** White-noise ACF band z(1 − α/2)/√n (each candidate's `acfBand` widens it by Bartlett's factor under its background). */
  band: number;
  /** Local maxima of the ACF that clear the band by a clear margin, for display. */
  acfPeaks: number[];
  /** Calendar periods tested (empty without `stepMs`). */
  calendarPeriods: CalendarPeriod[];
  /** The AR model of the whole detrended series used to rank spectral peaks (before any harmonic is removed). */
  background: { order: number; coefficients: number[]; variance: number };
}

/**
 * Zero padding of the periodogram: 2n puts a grid point between every two Fourier frequencies,
 * enough for the parabolic refinement, and the same transform length then serves the ACF
 * (n + maxPeriod ≤ 1.5n). On 1,242 simulated series (periods 5–10,080, n 200–100,000, three
 * amplitudes and AR(1) noise levels) 2n found the exact period as often as 4n (594 vs 585
 * times, misses 547 vs 549) in half the transform time.
 */
const PAD_FACTOR = 2;
/** Spectral peaks examined by the open search (the highest over the background). */
const SPECTRAL_PEAKS = 8;
/** Spectral peaks examined because their power alone is among the highest. */
const POWER_PEAKS = 3;
/** Harmonics k·f (k = 1..HARMONICS) removed before the background AR model of a candidate is fitted. */
const HARMONICS = 4;
/**
 * The fundamental of a candidate is taken out before its background is fitted only when it
 * repeats at least this often in the record. Below that, the AR level at the lowest
 * frequencies rests on the few ordinates there: removing one of them lowers the fitted
 * persistence and makes the removed ordinate look significant (on two weeks of a simulated
 * storm-driven level the week, 2 cycles, was "found" in 29 of 100 series with the fundamental
 * always removed; in none of 200 with this rule and ACF_FREE_CYCLES).
 */
const NOTCH_MIN_CYCLES = 6;
/** Half-width, in Fourier bins, of the neighbourhood whose median checks the AR level at a peak. */
const LOCAL_BINS = 24;
/** The AR level is replaced by the local one when the whitened local median is below this share of ln 2. */
const LOCAL_MISFIT = 0.25;
/**
 * A candidate repeating fewer times than this in the record must also be supported by the ACF
 * (above the background's own ACF by Bartlett's band under it): with so few repetitions the
 * spectral test rests on the few lowest ordinates, where a drift or a slow wander is hard to
 * tell from a cycle.
 */
const ACF_FREE_CYCLES = 6;
/**
 * Largest AR order of the background (AIC chooses up to this). Low on purpose: an AR(5)
 * spectrum cannot form a peak narrower than about a fifth of the frequency range, so even with
 * a harmonic left in the data it cannot take a one-bin cycle into the background.
 */
const AR_ORDER_CAP = 5;
/**
 * Repetitions a candidate needs in the record before its significant harmonics may stand in for
 * the ACF's support (below this the fundamental sits in the lowest two or three Fourier bins,
 * where a slow wander lives).
 */
const HARMONIC_SUPPORT_CYCLES = 3;

/** ACF local maxima at lags 2..maxPeriod whose rise above the preceding trough exceeds `margin`. */
function prominentAcfPeaks(r: Float64Array, maxPeriod: number, band: number, margin: number): number[] {
  const peaks: number[] = [];
  let trough = r[1];
  for (let k = 2; k <= maxPeriod; k++) {
    if (r[k] < trough) trough = r[k];
    const next = k + 1 < r.length ? r[k + 1] : -Infinity;
    if (r[k] > r[k - 1] && r[k] >= next && r[k] > band && r[k] - trough > margin) {
      peaks.push(k);
      trough = r[k];
    }
  }
  return peaks;
}

/**
 * The ACF of the detrended series: read off its periodogram when nothing is missing (one
 * transform instead of three), else by `autocorrelation` (R's na.pass rule for the gaps).
 */
function autocorrelationOf(detrended: Float64Array, power: Float64Array, size: number, maxLag: number): Float64Array {
  const n = detrended.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += detrended[i];
  if (!Number.isFinite(sum) || size < n + maxLag) return autocorrelation(detrended, { maxLag });
  // Ordinate at frequency 0 of the mean-corrected series (zero up to rounding).
  const mean = sum / n;
  let centred = 0;
  for (let i = 0; i < n; i++) centred += detrended[i] - mean;
  return autocorrelationFromPeriodogram(power, size, (centred * centred) / n, n, maxLag);
}

/** Periodogram ordinate n⁻¹|Σ d_t e^{−2πift}|² at one frequency (missing values count as 0), by complex rotation. */
function ordinateAt(d: Float64Array, frequency: number): number {
  const n = d.length;
  const omega = -2 * Math.PI * frequency;
  let re = 0;
  let im = 0;
  let zRe = 1;
  let zIm = 0;
  const stepRe = Math.cos(omega);
  const stepIm = Math.sin(omega);
  for (let t = 0; t < n; t++) {
    // Re-anchor every 4096 steps so the rotation does not drift.
    if ((t & 4095) === 0) [zRe, zIm] = [Math.cos(omega * t), Math.sin(omega * t)];
    const v = d[t];
    if (v === v) {
      re += v * zRe;
      im += v * zIm;
    }
    const nextRe = zRe * stepRe - zIm * stepIm;
    zIm = zRe * stepIm + zIm * stepRe;
    zRe = nextRe;
  }
  return (re * re + im * im) / n;
}

/** Largest grid ordinate within one grid point of frequency f (the top of its spectral lobe). */
function gridOrdinateNear(power: Float64Array, size: number, frequency: number): number {
  const at = Math.round(frequency * size) - 1;
  let best = 0;
  for (let i = Math.max(0, at - 1); i <= Math.min(power.length - 1, at + 1); i++) best = Math.max(best, power[i]);
  return best;
}

/** Vertex of the parabola through the log powers at i − 1, i, i + 1, as a frequency. */
function refinedFrequency(power: Float64Array, size: number, i: number): number {
  if (i < 1 || i + 1 >= power.length) return (i + 1) / size;
  const log = (k: number) => Math.log(Math.max(power[k], Number.MIN_VALUE));
  const [a, b, c] = [log(i - 1), log(i), log(i + 1)];
  const denom = a - 2 * b + c;
  const offset = denom < 0 ? (0.5 * (a - c)) / denom : 0;
  return (i + 1 + offset) / size;
}

interface Background {
  order: number;
  coefficients: Float64Array;
  variance: number;
  /** Autocorrelations ρ(1..order) the model was fitted to. */
  start: Float64Array;
}

/**
 * AR background: Yule–Walker by Durbin–Levinson with the order chosen by AIC up to `maxOrder`
 * (as `arYuleWalker`, R's `ar.yw`), fitted to the autocovariances γ(0..maxOrder) of the
 * detrended series after the sinusoids at `notch` frequencies are taken out. A sinusoid of
 * amplitude A contributes (1 − h/n)(A²/2)cos(2πfh) to the sample autocovariance at lag h, and
 * its least-squares amplitude is A² ≈ 4I(f)/n (Brockwell & Davis, *Introduction to Time Series
 * and Forecasting*, 2nd ed., §4.2, the periodogram as the regression sum of squares of the
 * pair cos/sin at f), so the notched autocovariance is γ(h) − Σ_k (2I(f_k)/n)(1 − h/n)cos(2πf_k h).
 */
function fitBackground(gamma: Float64Array, n: number, maxOrder: number, notch: { frequency: number; power: number }[]): Background {
  const g = new Float64Array(maxOrder + 1);
  for (let h = 0; h <= maxOrder; h++) {
    let v = gamma[h];
    for (const { frequency, power } of notch) v -= ((2 * power) / n) * (1 - h / n) * Math.cos(2 * Math.PI * frequency * h);
    g[h] = v;
  }
  // A series that is nothing but its cycle leaves (almost) no variance: keep a trace of it so
  // the background is tiny rather than undefined (Durbin–Levinson then stops at the order
  // where the leftover autocovariances stop being positive definite).
  const floor = 1e-12 * gamma[0];
  if (!(g[0] > floor)) g[0] = floor;
  const { coefficients, variances } = durbinLevinson(g, maxOrder);
  let usable = 0;
  while (usable < maxOrder && variances[usable + 1] > 0 && Number.isFinite(variances[usable + 1])) usable++;
  let order = 0;
  let best = Infinity;
  for (let m = 0; m <= usable; m++) {
    const aic = n * Math.log(variances[m]) + 2 * m;
    if (aic < best) [best, order] = [aic, m];
  }
  const start = new Float64Array(order);
  for (let h = 1; h <= order; h++) start[h - 1] = g[h] / g[0];
  return {
    order,
    coefficients: order ? Float64Array.from(coefficients[order - 1]) : new Float64Array(0),
    variance: (variances[order] * n) / (n - (order + 1)),
    start,
  };
}

/** The `size` highest scores offered (on equal scores the first offered, i.e. the lower frequency). */
class TopList {
  private readonly items: { i: number; score: number }[] = [];
  constructor(private readonly size: number) {}
  offer(i: number, score: number): void {
    const items = this.items;
    if (items.length === this.size && !(score > items[this.size - 1].score)) return;
    let at = items.length;
    while (at > 0 && items[at - 1].score < score) at--;
    items.splice(at, 0, { i, score });
    if (items.length > this.size) items.pop();
  }
  indices(): number[] {
    return this.items.map((x) => x.i);
  }
}

/** Chance that the largest of `count` independent Exp(1) ratios exceeds `ratio`: 1 − (1 − e^{−ratio})^count. */
function maxExponentialPValue(ratio: number, count: number): number {
  if (!(ratio > 0)) return 1;
  return Math.min(1, -Math.expm1(count * Math.log1p(-Math.exp(-ratio))));
}

const CALENDAR_WORDS: Record<Exclude<CalendarName, 'days' | 'hours'>, string> = { hour: '1 hour', day: '1 day', week: '1 week' };

/** A calendar-snapped period in words: "1 day", "3 days", "12 hours". */
function calendarLength(name: CalendarName, steps: number, stepMs: number): string {
  if (name === 'days') return `${Math.round((steps * stepMs) / 86_400_000)} days`;
  if (name === 'hours') return `${Math.round((steps * stepMs) / 3_600_000)} hours`;
  return CALENDAR_WORDS[name];
}

/** Rounded for a note: one decimal. */
const fmt = (v: number) => (Math.round(v * 10) / 10).toString();

/**
 * Finds the length of a repeating cycle (hourly, daily, weekly, yearly …) in samples, judging
 * each spectral peak against the series' own persistence.
 *
 * 1. The series is detrended (least-squares line) and its periodogram computed on a 2×
 *    zero-padded grid (frequencies in cycles per step).
 * 2. Background: the spectrum of an autoregressive model, σ²/|1 − Σ φ_j e^{−2πifj}|²
 *    (Brockwell & Davis, *Introduction to Time Series and Forecasting*, 2nd ed., §4.4;
 *    Priestley, *Spectral Analysis and Time Series*, 1981, §7.8), fitted by Yule–Walker with
 *    the order chosen by AIC up to 5 (as `arYuleWalker`, R's `ar.yw`). Without a cycle the
 *    periodogram ordinates are ≈ S(f)·Exp(1) (Brockwell & Davis, *Time Series: Theory and
 *    Methods*, 2nd ed., Thm 10.3.2), so I(f)/S(f) is the test ratio.
 *    The order and the cycle: an AR model fitted to a series that still contains a strong
 *    cycle shapes its own spectrum around it and explains the peak away (an AR(5) fitted to a
 *    12-step cosine of amplitude 5 in AR(1) noise, n = 240, leaves the peak 1.7 times its
 *    background instead of about 770 times the noise spectrum). So
 *    for each candidate frequency f the model is fitted to the autocovariances with the
 *    sinusoids at f, 2f, 3f, 4f taken out ((1 − h/n)(2I(f_k)/n)cos 2πf_k h each). A low order
 *    (≤ 5) then describes persistence only: it cannot form a peak one Fourier bin wide, so
 *    the cycle cannot hide in it, and a slow AR(1) "weather" keeps its power at low
 *    frequencies, where it belongs. Two limits: the fundamental is not taken out when it
 *    repeats fewer than 6 times in the record (or lies within 6 bins of the Nyquist
 *    frequency), because the AR level at the lowest frequencies rests on the few ordinates
 *    there and removing one makes that one look significant; and where the AR level is more
 *    than 4 times the median of the periodogram around the peak (±24 bins, median of Exp(1) =
 *    ln 2), as when a drift that is no straight line passes for persistence, the background
 *    is scaled down to that local level.
 * 3. Open search: the local maxima of the periodogram with the highest ratio to the whole
 *    series' AR spectrum (8) and the highest power alone (3) are examined; the raw period comes
 *    from the parabola through the log power at the grid maximum. The chance of a ratio c
 *    somewhere among the M grid frequencies searched is 1 − (1 − e^{−c})^M (a Fisher-type
 *    maximum test, Fisher 1929, Proc. R. Soc. A 125:54–59, against the AR background instead
 *    of a flat one; counting every padded grid point keeps it on the safe side).
 * 4. Calendar periods (with `stepMs`): the hour, day and week that are whole numbers of steps
 *    are tested at their exact frequency, corrected over the K calendar frequencies only
 *    (1 − (1 − e^{−c})^K), so a weak daily cycle under strong persistence, which a search over
 *    thousands of frequencies would miss, is still found. The two families share α by
 *    Bonferroni (each at α/2; reported p-values are doubled). A search peak whose raw frequency
 *    lies within one Fourier bin (|f_raw − 1/P| ≤ 1/n, the resolution of the periodogram;
 *    Priestley 1981 §6.2.3, §7.5) of a calendar period P is reported as exactly P steps, with
 *    the raw estimate kept in `exactPeriod` and a `note` saying so. A search peak within one
 *    bin of 2–6 whole days or of a whole-hour part of a day (12, 8, 6, 4, 3, 2 hours) is
 *    reported as exactly that many steps too (a raw 143.2 five-minute steps is 12 hours within
 *    the record's resolution, not a cycle one step shorter).
 * 5. A candidate that repeats fewer than 6 times in the record must also show in the ACF:
 *    r(P) above the background model's ACF by Bartlett's band under that model. Otherwise the
 *    ACF does not veto a peak: under strong persistence its sampling error is far wider than
 *    the white-noise band (the cold room: ACF 0.8 at one day, but mostly drift).
 *    Harmonics stand in for the ACF from 3 repetitions on: a cycle that is not a pure sine (a
 *    daylight arch, zero at night) puts power at 2f, 3f, 4f as well (its Fourier series;
 *    Bloomfield, *Fourier Analysis of Time Series*, 2nd ed., 2000, §2.2), so when the
 *    candidate is spectrally significant, its ACF lies above the background's and one of its
 *    harmonics, tested at the exact frequency over the candidate's background and corrected over
 *    the harmonics tested, is significant too, it counts as a cycle. A slow wander rarely puts
 *    significant power at both f and an exact multiple of it.
 * 6. A candidate whose frequency lies within one bin of k·g (k = 2…4) for a longer candidate of
 *    frequency g that is spectrally significant and repeats better in the ACF (ACF above its
 *    background by more) is a harmonic of it: `harmonicOf` names the longer one and it is never
 *    significant itself. The series repeats after the longer period, not after its part; the
 *    ACF at half a daylight-shaped day is negative.
 * 7. The best guess is the significant candidate whose ACF most exceeds the ACF its own AR
 *    background implies at that lag: at the true period a seasonal series repeats (Box,
 *    Jenkins & Reinsel, *Time Series Analysis*, 4th ed., §9.1), which prefers the fundamental
 *    over its harmonics, while the subtraction keeps persistence alone from favouring short
 *    periods.
 *
 * Cost: O(n log n) time (the transforms), O(n) per calendar frequency, O(p·n) over the grid
 * for the background spectrum, O(p²) per candidate; O(n) space.
 */
export function detectPeriod(x: Series, options: DetectPeriodOptions = {}): DetectPeriodResult {
  const fn = 'detectPeriod';
  assertSeries(x, fn);
  const n = x.length;
  if (n < 8) throw new AnalysisInputError(`${fn} requires at least 8 data points (got ${n})`, { reason: 'too-few-values', need: 8, got: n });
  const maxPeriod = integerOption(fn, 'maxPeriod', options.maxPeriod ?? Math.floor(n / 2), 2, Math.floor(n / 2));
  const alpha = options.alpha ?? 0.01;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  if (options.stepMs !== undefined && !(Number.isFinite(options.stepMs) && options.stepMs > 0)) {
    throw new AnalysisInputError(`${fn}: stepMs must be a positive number of milliseconds (got ${options.stepMs})`);
  }
  const calendars = options.stepMs === undefined ? [] : calendarPeriods(options.stepMs, maxPeriod);
  const multiples = options.stepMs === undefined ? [] : dayMultiples(options.stepMs, maxPeriod);
  const parts = options.stepMs === undefined ? [] : dayParts(options.stepMs, maxPeriod);

  const detrended = removeLinearTrend(x);
  const { power, size } = periodogram(detrended, PAD_FACTOR * n);
  const r = autocorrelationOf(detrended, power, size, Math.min(maxPeriod + 1, n - 1));
  const band = normalQuantile(1 - alpha / 2) / Math.sqrt(n);

  // Autocovariances on the periodogram's scale (divisor n, missing values counting as zero).
  let c0 = 0;
  for (let t = 0; t < n; t++) if (detrended[t] === detrended[t]) c0 += detrended[t] * detrended[t];
  c0 /= n;
  const orderLimit = Math.max(1, Math.min(AR_ORDER_CAP, n - 3, r.length - 1));
  const gamma = new Float64Array(orderLimit + 1);
  for (let h = 0; h <= orderLimit; h++) gamma[h] = r[h] * c0;
  const spectrumOf = (b: Background, f: number) => arSpectrum(b.coefficients, b.variance, f);

  // Grid indices searched: periods 2..maxPeriod, the Nyquist ordinate (χ²₁) left out.
  const first = Math.max(0, Math.ceil(size / maxPeriod) - 1);
  const last = Math.min(power.length - 2, Math.floor(size / 2) - 1);
  const searched = Math.max(1, last - first + 1);
  const families = calendars.length ? 2 : 1;

  // Open search: the local maxima with the highest ratio to the whole series' AR spectrum, and
  // the highest by power alone (a strong cycle can shape that AR model around itself).
  const global = fitBackground(gamma, n, orderLimit, []);
  const byRatio = new TopList(SPECTRAL_PEAKS);
  const byPower = new TopList(POWER_PEAKS);
  for (let i = Math.max(first, 1); i <= last; i++) {
    if (!(power[i] > power[i - 1] && power[i] >= power[i + 1])) continue;
    byRatio.offer(i, power[i] / spectrumOf(global, (i + 1) / size));
    byPower.offer(i, power[i]);
  }
  const peaks = [...new Set([...byRatio.indices(), ...byPower.indices()])];

  /** Background fitted with the harmonics k·f (k ≤ HARMONICS, below Nyquist) taken out. */
  const backgroundFor = (f: number, fundamentalPower: number): Background => {
    // Away from 0 and 1/2, where the cosine and sine at f are not nearly collinear.
    const notchable = (g: number) => n * Math.min(g, 0.5 - g) >= NOTCH_MIN_CYCLES;
    const notch = notchable(f) ? [{ frequency: f, power: fundamentalPower }] : [];
    for (let k = 2; k <= HARMONICS && k * f < 0.5; k++) if (notchable(k * f)) notch.push({ frequency: k * f, power: gridOrdinateNear(power, size, k * f) });
    return fitBackground(gamma, n, orderLimit, notch);
  };
  /**
   * The ACF the background implies at `period`, and Bartlett's band for the sample ACF there,
   * z(1 − α/2)·√((1 + 2 Σ_{k≥1} ρ(k)²)/n) (Bartlett 1946; Box, Jenkins & Reinsel, 4th ed.,
   * eq. 2.1.13, for a lag beyond which the model's ACF has died out).
   */
  const acfOf = (b: Background, period: number): { rho: number; band: number } => {
    const rho = arAutocorrelations(b.coefficients, b.start, period);
    let squares = 0;
    for (let k = 1; k < period; k++) squares += rho[k] * rho[k];
    return { rho: rho[period], band: band * Math.sqrt(1 + 2 * squares) };
  };
  /**
   * The background level at f: the AR spectrum, unless the periodogram around f (±LOCAL_BINS
   * Fourier bins, the peak's own ±2 bins left out) lies far below it — median of I/S under
   * LOCAL_MISFIT·ln 2 — as when a drift that is not a straight line makes the AR model see
   * persistence the spectrum near f does not have; the AR spectrum is then scaled to that
   * local median (median of Exp(1) = ln 2). Returns the level and the scale applied (1 if none).
   */
  const levelAt = (b: Background, f: number): { level: number; scale: number } => {
    const spectrum = spectrumOf(b, f);
    const centre = f * size - 1;
    const inner = (2 * size) / n;
    const outer = (LOCAL_BINS * size) / n;
    const whitened: number[] = [];
    for (let k = Math.max(0, Math.ceil(centre - outer)); k <= Math.min(power.length - 2, Math.floor(centre + outer)); k++) {
      if (Math.abs(k - centre) > inner) whitened.push(power[k] / spectrumOf(b, (k + 1) / size));
    }
    if (whitened.length < 8) return { level: spectrum, scale: 1 };
    whitened.sort((u, v) => u - v);
    const mid = whitened.length >> 1;
    const median = whitened.length % 2 ? whitened[mid] : (whitened[mid - 1] + whitened[mid]) / 2;
    const scale = median / Math.LN2;
    return scale < LOCAL_MISFIT ? { level: spectrum * scale, scale } : { level: spectrum, scale: 1 };
  };

  interface Draft {
    period: number;
    exactPeriod: number;
    calendar: CalendarName | null;
    peakRatio: number;
    pFamily: number;
    background: Background;
    how: 'search' | 'calendar' | 'both';
    /** Scale applied to the AR spectrum where it overstated the local level (1 if none). */
    scale: number;
  }
  const drafts: Draft[] = [];

  // Calendar periods, tested at their exact frequency.
  for (const c of calendars) {
    const f = 1 / c.steps;
    const ordinate = ordinateAt(detrended, f);
    const background = backgroundFor(f, ordinate);
    const { level, scale } = levelAt(background, f);
    const peakRatio = ordinate / level;
    // Raw estimate: the highest grid point within one Fourier bin, refined.
    let top = -1;
    for (let i = Math.max(0, Math.ceil((f - 1 / n) * size) - 1); i <= Math.min(power.length - 1, Math.floor((f + 1 / n) * size) - 1); i++) {
      if (top < 0 || power[i] > power[top]) top = i;
    }
    const exactPeriod = top < 0 ? c.steps : 1 / refinedFrequency(power, size, top);
    drafts.push({
      period: c.steps,
      exactPeriod,
      calendar: c.name,
      peakRatio,
      pFamily: maxExponentialPValue(peakRatio, calendars.length),
      background,
      how: 'calendar',
      scale,
    });
  }

  for (const i of peaks) {
    const f = refinedFrequency(power, size, i);
    const exactPeriod = 1 / f;
    const background = backgroundFor(f, gridOrdinateNear(power, size, f));
    const { level, scale } = levelAt(background, (i + 1) / size);
    const peakRatio = power[i] / level;
    const pFamily = maxExponentialPValue(peakRatio, searched);
    const near = calendarPeriodNear(f, n, calendars);
    if (near) {
      const merged = drafts.find((d) => d.calendar === near.name)!;
      if (merged.how === 'calendar') merged.exactPeriod = exactPeriod;
      if (pFamily < merged.pFamily) {
        merged.pFamily = pFamily;
        merged.peakRatio = peakRatio;
        merged.scale = scale;
      }
      merged.how = 'both';
      continue;
    }
    // A cycle of whole days (e.g. watering every other day) or of whole-hour parts of a day (a
    // defrost every 6 hours) is reported as exactly that many steps.
    const whole = calendarPeriodNear(f, n, [...multiples, ...parts]);
    const period = whole ? whole.steps : Math.min(maxPeriod, Math.max(2, Math.round(exactPeriod)));
    if (drafts.some((d) => d.period === period)) continue;
    drafts.push({ period, exactPeriod, calendar: whole ? whole.name : null, peakRatio, pFamily, background, how: 'search', scale });
  }

  /** The frequency a draft stands for: exact for a calendar period, else the refined peak. */
  const frequencyOf = (d: Draft) => (d.calendar ? 1 / d.period : 1 / d.exactPeriod);
  /**
   * Chance, in a series without cycles, that one of the harmonics k·f (k = 2…4, below the
   * Nyquist frequency) of a draft stands this far over its background: each ordinate, taken at
   * the exact harmonic frequency, over the draft's own background (which has those harmonics
   * taken out), corrected over the harmonics tested as the calendar periods are.
   */
  const harmonicPValue = (d: Draft): number => {
    const f = frequencyOf(d);
    const ratios: number[] = [];
    for (let k = 2; k <= HARMONICS && k * f < 0.5 - 1 / n; k++) ratios.push(ordinateAt(detrended, k * f) / levelAt(d.background, k * f).level);
    return ratios.length ? maxExponentialPValue(Math.max(...ratios), ratios.length) : 1;
  };

  const judged = drafts.map((d) => {
    const pValue = Math.min(1, families * d.pFamily);
    const acf = r[d.period];
    const { rho: backgroundAcf, band: acfBand } = acfOf(d.background, d.period);
    const cycles = n / d.period;
    const harmonicsSupport =
      pValue < alpha && cycles >= HARMONIC_SUPPORT_CYCLES && acf > backgroundAcf && cycles < ACF_FREE_CYCLES && harmonicPValue(d) < alpha;
    return { d, pValue, acf, backgroundAcf, acfBand, acfSupports: acf - backgroundAcf > acfBand, harmonicsSupport };
  });
  // A harmonic of a longer, spectrally significant candidate that repeats better in the ACF is
  // part of that cycle's shape: a cycle of period P that is not a pure sine has its power at
  // the frequencies k/P (its Fourier series; Bloomfield, *Fourier Analysis of Time Series*, 2nd
  // ed., 2000, §2.2), and the series repeats after P steps, not after P/k. Without this, a
  // daylight-shaped day on a few days of record came out as "146 steps" (about half a day).
  const harmonicOf = judged.map(({ d, acf, backgroundAcf }) => {
    const f = frequencyOf(d);
    for (const other of judged) {
      if (other.d === d || other.d.period <= d.period || !(other.pValue < alpha)) continue;
      if (!(other.acf - other.backgroundAcf > acf - backgroundAcf)) continue;
      const g = frequencyOf(other.d);
      for (let k = 2; k <= HARMONICS; k++) if (Math.abs(f - k * g) <= 1 / n + 1e-15) return other.d.period;
    }
    return null;
  });

  const candidates: PeriodCandidate[] = judged.map(({ d, pValue, acf, backgroundAcf, acfBand, acfSupports, harmonicsSupport }, index) => {
    const model = `AR(${d.background.order})`;
    let note: string;
    if (d.calendar) {
      const what = `${d.period} steps = ${calendarLength(d.calendar, d.period, options.stepMs!)}`;
      note =
        d.how === 'calendar'
          ? `${what} (tested at the calendar frequency: periodogram ${fmt(d.peakRatio)} times the ${model} background)`
          : `${what} (raw estimate ${fmt(d.exactPeriod)}, within the spectral resolution of 1/n cycles per step)`;
    } else {
      note = `${d.period} steps (raw estimate ${fmt(d.exactPeriod)}; ${calendars.length ? 'no calendar period within the spectral resolution' : 'no grid step given, so no calendar period was checked'})`;
    }
    if (d.scale < 1) note += `; the ${model} background was ${fmt(1 / d.scale)} times the periodogram around the peak and was scaled down to it`;
    const fundamental = harmonicOf[index];
    if (fundamental !== null) note += `; a harmonic of the ${fundamental}-step cycle (part of its shape, not a cycle of its own)`;
    else if (harmonicsSupport && !acfSupports) note += '; its harmonics stand out too, which backs a cycle seen only a few times';
    const sources: PeriodCandidate['sources'] = ['periodogram'];
    if (acfSupports) sources.push('acf');
    if (harmonicsSupport) sources.push('harmonics');
    return {
      period: d.period,
      exactPeriod: d.exactPeriod,
      calendar: d.calendar,
      acf,
      backgroundAcf,
      acfBand,
      peakRatio: d.peakRatio,
      backgroundOrder: d.background.order,
      pValue,
      sources,
      significant: fundamental === null && pValue < alpha && (acfSupports || harmonicsSupport || n / d.period >= ACF_FREE_CYCLES),
      harmonicOf: fundamental,
      note,
    };
  });
  candidates.sort((p, q) => Number(q.significant) - Number(p.significant) || q.acf - q.backgroundAcf - (p.acf - p.backgroundAcf));
  const best = candidates.length && candidates[0].significant ? candidates[0].period : null;
  return {
    best,
    candidates,
    band,
    acfPeaks: prominentAcfPeaks(r, maxPeriod, band, 2 * band),
    calendarPeriods: calendars,
    background: { order: global.order, coefficients: Array.from(global.coefficients), variance: global.variance },
  };
}
