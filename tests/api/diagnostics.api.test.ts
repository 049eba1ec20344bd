/**
 * Channel diagnostics over HTTP on the real MariaDB: the JSON carries exactly the numbers the
 * engine computes on the same readings (the engine is called here on the readings that were
 * posted; its own agreement with R and statsmodels is checked in tests/reference and beside
 * channel-diagnostics.ts), the cache, cross-correlation, the worker pool, cancellation, the CSV
 * export and the 400/404/422 answers. The readings are simulated (behaviour checks only).
 */
import { createServer, get as httpGet } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse as parseCsv } from 'csv-parse/sync';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, standInAppDeps } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { createApp } from '../../server/app.ts';
import { createAnalysisPool, type AnalysisPool } from '../../server/workers/analysis-pool.ts';
import { channelDiagnostics, rangeComparison, type ChannelDiagnosticsOptions } from '../../server/analysis/index.ts';

const STEP = 600_000; // 10 minutes
const T0 = Date.UTC(2026, 9, 1);
const N = 6 * 144; // six days
const DAY_STEPS = 144;
const LAG_STEPS = 12; // soil moisture follows air temperature by 2 hours

let t: TestApp;
let f: LabWithEverything;
let cookie: string;
let base: string;
let soilId: number;
const air = { timestamps: [] as number[], values: [] as number[] };
const soil = { timestamps: [] as number[], values: [] as number[] };

/** A seeded generator (Numerical Recipes' LCG constants), so the simulated data repeat exactly. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

async function ingest(readings: Array<{ channel: string; ts: number; value: number }>) {
  await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings }).expect(200);
}

/** A new channel on the fixture's logger, made by the lab's founder; its id. */
async function addChannel(channel: { key: string; label: string; unit: string }): Promise<number> {
  const founder = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  const made = await request(t.app).post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/channels`).set('Cookie', founder).send(channel).expect(201);
  return made.body.channel.id;
}

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  await onLargestPlan(t.db, f.lab.id); // the simulated readings reach back further than the free plan shows
  const scientist = await buildMember(t.db, f.lab, { role: 'scientist' });
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, scientist.id);
  base = `/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}`;
  soilId = await addChannel({ key: 'soil_m', label: 'Soil moisture', unit: '%' });
  const rnd = lcg(7);
  let e = 0;
  const level: number[] = [];
  for (let i = 0; i < N + LAG_STEPS; i++) {
    e = 0.6 * e + rnd();
    level.push(15 + 4 * Math.sin((2 * Math.PI * i) / DAY_STEPS) + e);
  }
  const rows = [];
  for (let i = 0; i < N; i++) {
    if (i >= 400 && i < 405) continue; // a 50-minute gap in the air channel
    air.timestamps.push(T0 + i * STEP);
    air.values.push(level[i + LAG_STEPS]);
    rows.push({ channel: 'air_t', ts: T0 + i * STEP, value: level[i + LAG_STEPS] });
  }
  for (let i = 0; i < N; i++) {
    const v = 30 + 2 * level[i] + rnd() / 5;
    soil.timestamps.push(T0 + i * STEP);
    soil.values.push(v);
    rows.push({ channel: 'soil_m', ts: T0 + i * STEP, value: v });
  }
  await ingest(rows);
});
afterAll(async () => t.close());

const range = `from=${new Date(T0).toISOString()}&to=${new Date(T0 + N * STEP).toISOString()}`;
const engineOptions = (over: Partial<ChannelDiagnosticsOptions> = {}): ChannelDiagnosticsOptions => ({
  step: STEP,
  agg: 'mean',
  difference: 0,
  seasonalDifference: 0,
  period: 'auto',
  decomposition: 'stl',
  alpha: 0.05,
  labels: { channel: 'Air temperature', partner: 'Soil moisture' },
  ...over,
});
/** What JSON makes of an engine array: NaN becomes null. */
const json = (a: ArrayLike<number>) => Array.from(a, (v) => (Number.isNaN(v) ? null : v));

describe('GET /channels/:channelId/diagnostics', () => {
  it('returns the engine’s numbers for the same readings, with the method and parameters used', async () => {
    const res = await request(t.app).get(`${base}/diagnostics?${range}&step=600`).set('Cookie', cookie).expect(200);
    const r = res.body;
    const engine = channelDiagnostics(air, engineOptions());
    expect(r.cached).toBe(false);
    expect(r.series).toMatchObject({ start: T0, stepMs: STEP, n: N, missing: 5, readings: N - 5 });
    expect(r.series.emptyCells).toEqual([400, 401, 402, 403, 404]);
    expect(Array.from(engine.grid.values.subarray(399, 406), Number.isNaN)).toEqual([false, true, true, true, true, true, false]);
    expect(r.period).toMatchObject({ used: DAY_STEPS, source: 'detected' });
    expect(r.acf.values).toEqual(json(engine.acf));
    expect(r.acf.lags).toEqual(Array.from({ length: engine.acf.length }, (_, k) => k));
    expect(r.pacf.values).toEqual(json(engine.pacf));
    expect(r.bands).toEqual({ alpha: 0.05, z: engine.bands.z, whiteNoise: engine.bands.whiteNoise, bartlett: json(engine.bands.bartlett) });
    expect(r.ljungBox).toEqual(engine.ljungBox);
    expect(r.ljungBox.map((b: { lag: number }) => b.lag)).toEqual([5, 10, 15, 20, 144, 288]);
    expect(r.effectiveSampleSize).toEqual({ ...engine.effectiveSampleSize });
    expect(r.identification.verdict).toBe(engine.identification.verdict);
    expect(r.identification.explanation).toBe(engine.identification.explanation);
    expect(r.identification.evidence.acf).toEqual(json(engine.identification.evidence.acf));
    if (engine.decomposition.method === 'none') throw new Error('expected a decomposition');
    expect(r.decomposition.trend).toEqual(json(engine.decomposition.trend));
    expect(r.decomposition.seasonal).toEqual(json(engine.decomposition.seasonal));
    expect(r.decomposition.remainder).toEqual(json(engine.decomposition.remainder));
    expect(r.decomposition.outliers.indices).toEqual(engine.decomposition.outliers.indices);
    expect(r.method.resolved).toMatchObject({
      stepS: 600,
      agg: 'mean',
      source: { kind: 'rollups', resolutionS: 60 },
      period: 144,
      periodSource: 'detected',
      decomposition: 'stl',
      maxLag: engine.maxLag,
    });
    expect(r.method.parameters).toMatchObject({ agg: 'mean', period: 'auto', decomposition: 'stl', difference: 0, from: new Date(T0).toISOString() });
    expect(r.method.notes.join(' ')).toContain(
      '5 of 864 cells were empty; STL, period detection and process identification filled them by linear interpolation',
    );
    expect(r.channel).toMatchObject({ id: f.ids.channelId, key: 'air_t', logger: { id: f.ids.loggerId, timezone: 'UTC' } });
    // the process model is the engine's, fitted on the series less its daily cycle
    const model = engine.identification.model!;
    expect(r.processModel).toMatchObject({
      available: true,
      fittedOn: 'remainder',
      period: DAY_STEPS,
      cells: model.cells,
      readingsPerIndependent: model.readingsPerIndependent,
    });
    expect(r.processModel.chosen).toMatchObject({
      p: model.p,
      q: model.q,
      ar: model.ar,
      ma: model.ma,
      standardErrors: model.standardErrors,
      logLik: model.logLik,
    });
    expect(r.processModel.fittedTo).toBe(T0 + N * STEP);
    expect(r.processModel.candidates).toHaveLength(10); // every p, q ≤ 3 with p + q ≤ 3
    expect(r.processModel.sentence).toMatch(/^Once its 1 d cycle is removed, Air temperature /);
    expect(r.identification.fittedOn).toBe('remainder');
    // the trend is the engine's slope per 10-minute step, scaled to a day (144 steps) and a year
    if (!engine.trend.available) throw new Error('expected a trend');
    expect(r.trend).toMatchObject({ available: true, fittedOn: 'adjusted', unit: '°C', lag: engine.trend.lag, n: N - 5 });
    expect(r.trend.perDay.slope).toBeCloseTo(engine.trend.slope * 144, 12);
    expect(r.trend.perYear.slope).toBeCloseTo(engine.trend.slope * 144 * 365.25, 9);
    expect(r.trend.perDay.hacInterval[0]).toBeCloseTo(engine.trend.interval[0] * 144, 12);
    expect(r.trend.perDay.olsInterval[1]).toBeCloseTo(engine.trend.intervalOls[1] * 144, 12);
    expect(r.trend.sentence).toMatch(/^Allowing for autocorrelation, Air temperature \(after removing the seasonal cycle\) changes by /);
  });

  it('states one period: a daily cycle at 5-minute steps is 288 steps in every section, with the raw estimate named as such', async () => {
    // a seeded week of 5-minute readings on a channel of its own: a daily cycle plus noise
    const lightId = await addChannel({ key: 'light_5m', label: 'Bench light', unit: 'lx' });
    const FIVE = 300_000;
    const rnd = lcg(11);
    const rows = Array.from({ length: 7 * 288 }, (_, i) => ({
      channel: 'light_5m',
      ts: T0 + i * FIVE,
      value: 50 + 20 * Math.sin((2 * Math.PI * i) / 288) + 3 * rnd(),
    }));
    await ingest(rows);
    const week = `from=${new Date(T0).toISOString()}&to=${new Date(T0 + 7 * 288 * FIVE).toISOString()}`;
    for (const decomposition of ['stl', 'classical']) {
      const res = await request(t.app)
        .get(`/api/v1/labs/${f.lab.slug}/channels/${lightId}/diagnostics?${week}&step=300&decomposition=${decomposition}`)
        .set('Cookie', cookie)
        .expect(200);
      const r = res.body;
      expect(r.period).toMatchObject({ used: 288, source: 'detected' });
      expect(r.identification.period).toBe(288);
      expect(r.identification.evidence.period).toBe(288);
      expect(r.decomposition.period).toBe(288);
      expect(r.method.resolved.period).toBe(288);
      expect(r.processModel.period).toBe(288);
      // the raw estimate is the used candidate's, named as an estimate and not as a second period
      const used = r.period.candidates.find((c: { period: number }) => c.period === 288);
      expect(r.period.rawEstimate).toBe(used.exactPeriod);
      expect(Math.abs(r.period.rawEstimate - 288)).toBeGreaterThan(0);
      expect(r.period.statement).toBe(
        `Period used everywhere in this report: 288 steps (1 day), detected (the spectral peak's raw estimate, ${Number(used.exactPeriod.toFixed(1))} steps, lies within one frequency step of a day and is reported as exactly that).`,
      );
    }
  });

  it('counts readings as readings and cells as cells when several readings fall in one step', async () => {
    // hourly steps over six days of ten-minute readings: 144 cells from 864 − 5 readings (the gap)
    const hourly = await request(t.app).get(`${base}/diagnostics?${range}&step=3600`).set('Cookie', cookie).expect(200);
    expect(hourly.body.method.resolved.source).toEqual({ kind: 'rollups', resolutionS: 3600 });
    expect(hourly.body.series).toMatchObject({ n: 144, missing: 0, readings: N - 5 });
    // the same step read from raw readings (median) counts the same readings
    const raw = await request(t.app).get(`${base}/diagnostics?${range}&step=3600&agg=median`).set('Cookie', cookie).expect(200);
    expect(raw.body.method.resolved.source).toEqual({ kind: 'readings' });
    expect(raw.body.series).toMatchObject({ n: 144, readings: N - 5 });
  });

  it('reads raw readings for a median and still matches the engine; differencing applies before the ACF', async () => {
    const res = await request(t.app)
      .get(`${base}/diagnostics?${range}&step=1200&agg=median&difference=1&decomposition=classical&maxLag=30`)
      .set('Cookie', cookie)
      .expect(200);
    const engine = channelDiagnostics(air, engineOptions({ step: 1_200_000, agg: 'median', difference: 1, decomposition: 'classical', maxLag: 30 }));
    expect(res.body.method.resolved.source).toEqual({ kind: 'readings' });
    expect(res.body.acf.values).toEqual(json(engine.acf));
    expect(res.body.acf.values).toHaveLength(31);
    expect(res.body.analysed).toEqual({ n: engine.analysed.n, missing: engine.analysed.missing });
    expect(res.body.decomposition.method).toBe('classical');
    expect(res.body.decomposition.trend).toEqual(json(engine.decomposition.method === 'none' ? [] : engine.decomposition.trend));
  });

  it('classical decomposition: the observed series is whole while the trend is undefined for half a cycle at each end', async () => {
    const res = await request(t.app).get(`${base}/diagnostics?${range}&step=600&decomposition=classical`).set('Cookie', cookie).expect(200);
    const d = res.body.decomposition;
    const engine = channelDiagnostics(air, engineOptions({ decomposition: 'classical' }));
    expect(d).toMatchObject({ method: 'classical', period: DAY_STEPS, cells: null });
    // observed: every cell's grid value, null only in the 50-minute gap (cells 400–404)
    expect(d.observed).toEqual(json(engine.grid.values));
    expect(d.observed).toHaveLength(N);
    expect(d.observed[0]).toBeCloseTo(air.values[0], 12);
    expect(d.observed[N - 1]).toBeCloseTo(air.values[air.values.length - 1], 12);
    // the centred moving average over an even cycle of 144 leaves 72 cells undefined at each end
    // (R 4.2.2 stats::decompose returns NA there: filter(x, c(0.5, rep(1, 143), 0.5) / 144, sides = 2))
    const defined = (a: Array<number | null>) => a.map((v) => v !== null);
    expect(defined(d.trend).slice(0, 73)).toEqual([...Array(72).fill(false), true]);
    expect(defined(d.trend).slice(N - 73)).toEqual([true, ...Array(72).fill(false)]);
    expect(defined(d.remainder).slice(0, 72).some(Boolean)).toBe(false);
  });

  it('thins a long decomposition for drawing: the kept cells carry the engine’s values, extremes and outliers included', async () => {
    // One-minute steps over six days of ten-minute readings: 8,631 cells, above the 4,000 drawn.
    const res = await request(t.app).get(`${base}/diagnostics?${range}&step=60&period=1440&maxLag=20`).set('Cookie', cookie).expect(200);
    const engine = channelDiagnostics(air, engineOptions({ step: 60_000, period: 1440, maxLag: 20 }));
    if (engine.decomposition.method === 'none') throw new Error('expected a decomposition');
    const e = engine.decomposition;
    const d = res.body.decomposition;
    expect(res.body.method.resolved.source).toEqual({ kind: 'rollups', resolutionS: 60 });
    expect(res.body.acf.values).toEqual(json(engine.acf));
    expect(engine.grid.n).toBe(8631);
    const cells: number[] = d.cells;
    expect(cells.length).toBeLessThanOrEqual(4000);
    expect(cells.length).toBeGreaterThan(1000);
    expect(cells.every((c, j) => j === 0 || c > cells[j - 1])).toBe(true);
    expect(d.thinned).toMatchObject({ cells: cells.length, of: engine.grid.n });
    expect(d.thinned.note).toContain(`Thinned for drawing: ${cells.length.toLocaleString('en')} of 8,631 cells`);
    expect(d.trend).toEqual(json(cells.map((i) => e.trend[i])));
    expect(d.seasonal).toEqual(json(cells.map((i) => e.seasonal[i])));
    expect(d.remainder).toEqual(json(cells.map((i) => e.remainder[i])));
    for (const part of [e.trend, e.seasonal, e.remainder]) {
      const values = Array.from(part);
      expect(cells).toContain(values.indexOf(Math.max(...values)));
      expect(cells).toContain(values.indexOf(Math.min(...values)));
    }
    expect(d.outliers.indices).toEqual(e.outliers.indices);
    for (const i of e.outliers.indices) expect(cells).toContain(i);
  });

  it('serves a repeat from the cache, and recomputes after a new reading arrives', async () => {
    const path = `${base}/diagnostics?${range}&step=600&decomposition=none&maxLag=24`;
    const first = await request(t.app).get(path).set('Cookie', cookie).expect(200);
    const again = await request(t.app).get(path).set('Cookie', cookie).expect(200);
    expect(first.body.cached).toBe(false);
    expect(again.body.cached).toBe(true);
    expect({ ...again.body, cached: false }).toEqual(first.body);
    // A reading after the range: the channel's data version moves on, so the cached result is
    // no longer served (the cache never reasons about which readings a change touches).
    await ingest([{ channel: 'air_t', ts: T0 + (N + 3) * STEP, value: 40 }]);
    const after = await request(t.app).get(path).set('Cookie', cookie).expect(200);
    expect(after.body.cached).toBe(false);
    expect({ ...after.body, cached: false }).toEqual(first.body);
    expect((await request(t.app).get(path).set('Cookie', cookie).expect(200)).body.cached).toBe(true);
  });

  it('reads a range once for other parameters on it, and again after a new reading', async () => {
    // The cached grid is told apart from a fresh read by changing one stored cell behind the
    // app's back (no new data version): requests that reuse the grid do not see the change.
    const path = (extra: string) => `${base}/diagnostics?${range}&step=600&decomposition=none&maxLag=24${extra}`;
    const meanOf = async (extra: string) => (await request(t.app).get(path(extra)).set('Cookie', cookie).expect(200)).body.effectiveSampleSize.mean as number;
    const cell = { tenant_id: f.lab.id, channel_id: f.ids.channelId, resolution_s: 60, bucket_start: T0 + 100 * STEP };
    const stored = await t.db('reading_rollups').where(cell).first('sum_value', 'count_value');
    const first = await meanOf('&alpha=0.049');
    try {
      await t
        .db('reading_rollups')
        .where(cell)
        .update({ sum_value: 1000 * stored.count_value });
      // other parameters (the mean is of the undifferenced grid either way): the grid read before
      expect(await meanOf('&alpha=0.048&difference=1')).toBe(first);
      // a reading after the range moves the channel's data version on: the range is read again
      await ingest([{ channel: 'air_t', ts: T0 + (N + 5) * STEP, value: 12 }]);
      expect(await meanOf('&alpha=0.047&difference=1')).toBeGreaterThan(first + 0.5);
    } finally {
      await t.db('reading_rollups').where(cell).update({ sum_value: stored.sum_value });
      // and once more, so that no later test is served the changed cell from memory
      await ingest([{ channel: 'air_t', ts: T0 + (N + 6) * STEP, value: 12 }]);
    }
    expect(await meanOf('&alpha=0.046')).toBeCloseTo(first, 10);
  });

  it('cross-correlates with another channel of the lab and says which one trails, in R’s sign convention', async () => {
    const res = await request(t.app)
      .get(`${base}/diagnostics?${range}&step=600&decomposition=none&ccfWith=${soilId}&ccfMaxLag=30`)
      .set('Cookie', cookie)
      .expect(200);
    const engine = channelDiagnostics(air, engineOptions({ decomposition: 'none', ccfMaxLag: 30 }), soil);
    const ccf = res.body.crossCorrelation;
    expect(ccf.with).toMatchObject({ id: soilId, key: 'soil_m' });
    expect(ccf.method).toBe('prewhitened');
    expect(ccf.values).toEqual(json(engine.crossCorrelation!.values));
    expect(ccf.band).toBe(engine.crossCorrelation!.band);
    expect(ccf.simultaneousBand).toBe(engine.crossCorrelation!.simultaneousBand);
    expect(ccf.prewhitening).toEqual(engine.crossCorrelation!.prewhitening);
    expect(ccf.raw.values).toEqual(json(engine.crossCorrelation!.raw.values));
    // Soil moisture was built as air temperature 12 steps (2 h) earlier: cor(air[t+k], soil[t]) peaks at k = −12,
    // prewhitened and raw alike, and beyond the band that holds for all 61 lags together.
    expect(ccf.strongest).toMatchObject({ lag: -LAG_STEPS, lagMs: -2 * 3_600_000, significant: true });
    expect(ccf.raw.strongest).toMatchObject({ lag: -LAG_STEPS });
    expect(Math.abs(ccf.strongest.value)).toBeGreaterThan(ccf.simultaneousBand);
    expect(ccf.explanation).toContain('Soil moisture follows Air temperature by about 2 h, and the two move in the same direction');
  });

  it('runs the same bundle on the worker pool (one task) with identical numbers', async () => {
    const pool = createAnalysisPool({ maxThreads: 1 });
    try {
      const app = createApp(standInAppDeps(t, { analysisPool: pool }));
      const path = `${base}/diagnostics?${range}&step=600&ccfWith=${soilId}`;
      const viaPool = await request(app).get(path).set('Cookie', cookie).expect(200);
      const inProcess = await request(t.app).get(path).set('Cookie', cookie).expect(200);
      expect({ ...viaPool.body, cached: null }).toEqual({ ...inProcess.body, cached: null });
    } finally {
      await pool.close();
    }
  });

  it('aborts the engine task when the client disconnects', async () => {
    let aborted = false;
    let started = false;
    const hanging: AnalysisPool = {
      run: (_task, options) =>
        new Promise((_resolve, reject) => {
          started = true;
          options?.signal?.addEventListener('abort', () => {
            aborted = true;
            reject(Object.assign(new Error('aborted'), { name: 'AbortError' }));
          });
        }),
      close: async () => {},
    };
    const server = createServer(createApp(standInAppDeps(t, { analysisPool: hanging })));
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    try {
      const { port } = server.address() as AddressInfo;
      const req = httpGet({ host: '127.0.0.1', port, path: `${base}/diagnostics?${range}&step=600&maxLag=11`, headers: { cookie } });
      req.on('error', () => {});
      for (let i = 0; i < 100 && !started; i++) await new Promise((r) => setTimeout(r, 20));
      expect(started).toBe(true);
      expect(aborted).toBe(false);
      req.destroy();
      for (let i = 0; i < 100 && !aborted; i++) await new Promise((r) => setTimeout(r, 20));
      expect(aborted).toBe(true);
    } finally {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
    }
  });

  it('answers 400 naming each refused field by its label, with the field keys in `fields`', async () => {
    const cases: Array<[string, string, string]> = [
      ['agg=mode', 'agg', 'Summary of each step: must be mean, median, last, lowest or highest.'],
      ['difference=3', 'difference', 'Differencing: must be at most 2.'],
      ['seasonalDifference=2', 'seasonalDifference', 'Seasonal difference: must be at most 1.'],
      ['period=1', 'period', 'Cycle length: must be “auto”, “none” or a whole number of steps from 2 to 100,000.'],
      [
        'period=none&seasonalDifference=1',
        'seasonalDifference',
        'Seasonal difference: needs a cycle length (found automatically or a number of steps), not “none”.',
      ],
      ['decomposition=x11', 'decomposition', 'Decomposition: must be STL, robust STL, classical or none.'],
      ['alpha=0', 'alpha', 'Significance level: must be above 0.'],
      ['alpha=0.9', 'alpha', 'Significance level: must be at most 0.5.'],
      ['maxLag=0', 'maxLag', 'Longest lag: must be at least 1.'],
      ['ccfMaxLag=5', 'ccfMaxLag', 'Longest lag between the channels: only applies when a second channel is chosen.'],
      ['step=0', 'step', 'Step: must be at least 1.'],
      [
        'step=1',
        'step',
        'Step: the chosen range holds 518,400 steps of 1 second, more than the 300,000 one run may take: choose a longer step or a shorter range.',
      ],
    ];
    for (const [query, field, message] of cases) {
      const res = await request(t.app).get(`${base}/diagnostics?${range}&${query}`).set('Cookie', cookie);
      expect(res.status, query).toBe(400);
      expect(res.body.error.code, query).toBe('invalid_input');
      expect(res.body.error.message, query).toBe(message);
      expect(
        res.body.error.fields.map((p: { field: string }) => p.field),
        query,
      ).toEqual([field]);
    }
  });

  it('answers 422 in plain words when the data cannot support the analysis: what the range gave, what is needed, what to do', async () => {
    const empty = await request(t.app)
      .get(`${base}/diagnostics?from=${T0 - 86_400_000}&to=${T0}`)
      .set('Cookie', cookie)
      .expect(422);
    expect(empty.body.error).toEqual({ code: 'analysis_input', message: 'This channel has no readings in the chosen range.' });
    const few = await request(t.app)
      .get(`${base}/diagnostics?from=${T0}&to=${T0 + 20 * STEP}&step=600`)
      .set('Cookie', cookie)
      .expect(422);
    expect(few.body.error).toEqual({
      code: 'analysis_input',
      message:
        'The chosen range gave 20 values in 10-minute steps, and this analysis needs at least 30 to give dependable figures. Choose a longer range or a shorter step.',
    });
    const long = await request(t.app).get(`${base}/diagnostics?${range}&step=600&period=500&decomposition=stl`).set('Cookie', cookie).expect(422);
    expect(long.body.error.message).toBe(
      'A cycle length of 500 steps cannot be seen twice in the chosen range; it allows at most 432 steps. Choose a shorter cycle length or a longer range.',
    );
  });

  it('answers 422 naming what the seasonal difference left when the range is too short for it', async () => {
    // 53 hourly steps with readings; removing the 24-step (daily) cycle leaves 29, one short of the 30 the correlations need
    const res = await request(t.app)
      .get(`${base}/diagnostics?from=${T0}&to=${T0 + 53 * 3_600_000}&step=3600&period=24&seasonalDifference=1&decomposition=none`)
      .set('Cookie', cookie)
      .expect(422);
    expect(res.body.error).toEqual({
      code: 'analysis_input',
      message:
        'After removing the daily cycle, 29 values are left and at least 30 are needed for the correlations and tests to mean anything. Choose a longer range or a shorter step.',
    });
    expect(res.body.error.message).not.toMatch(/\b[a-z]+[A-Z][A-Za-z0-9]*\b/);
  });

  it("answers 404 for another lab's channel, as the channel and as ccfWith", async () => {
    const other = await buildLabWithEverything(t.db);
    const asChannel = await request(t.app)
      .get(`/api/v1/labs/${f.lab.slug}/channels/${other.ids.channelId}/diagnostics?${range}`)
      .set('Cookie', cookie)
      .expect(404);
    expect(asChannel.body.error).toEqual({ code: 'not_found', message: 'No such channel in this lab.' });
    const asPartner = await request(t.app).get(`${base}/diagnostics?${range}&step=600&ccfWith=${other.ids.channelId}`).set('Cookie', cookie).expect(404);
    expect(asPartner.body.error).toEqual({ code: 'not_found', message: 'No such channel in this lab.' });
  });
});

describe('GET /channels/:channelId/comparison', () => {
  const half = T0 + (N / 2) * STEP;
  const ranges = `aFrom=${new Date(T0).toISOString()}&aTo=${new Date(half).toISOString()}&bFrom=${new Date(half).toISOString()}&bTo=${new Date(T0 + N * STEP).toISOString()}`;

  it('compares two ranges of one channel with the engine’s numbers: effective-size interval beside Welch’s', async () => {
    const res = await request(t.app).get(`${base}/comparison?${ranges}&step=600`).set('Cookie', cookie).expect(200);
    const inA = (ts: number) => ts < half;
    const pick = (keep: (ts: number) => boolean) => {
      const idx = air.timestamps.map((ts, i) => (keep(ts) ? i : -1)).filter((i) => i >= 0);
      return { timestamps: idx.map((i) => air.timestamps[i]), values: idx.map((i) => air.values[i]) };
    };
    const engine = rangeComparison(
      pick(inA),
      pick((ts) => !inA(ts)),
      { step: STEP, agg: 'mean', alpha: 0.05 },
    );
    const r = res.body;
    expect(r.channel).toMatchObject({ id: f.ids.channelId, key: 'air_t' });
    expect(r.other).toBeNull();
    expect(r.difference).toBe(engine.difference);
    expect(r.a).toMatchObject({ from: T0, to: half, n: engine.a.n, mean: engine.a.mean, effectiveN: engine.a.nEff, autocorrelationTime: engine.a.tau });
    expect(r.b).toMatchObject({ n: engine.b.n, mean: engine.b.mean, effectiveN: engine.b.nEff });
    expect(r.dependent).toEqual({ standardError: engine.effective.standardError, df: engine.effective.df, interval: engine.effective.interval });
    expect(r.welch).toEqual({ standardError: engine.welch.standardError, df: engine.welch.df, interval: engine.welch.interval });
    // persistent readings: the honest interval is wider than the one that assumes independence
    expect(r.dependent.interval[1] - r.dependent.interval[0]).toBeGreaterThan(r.welch.interval[1] - r.welch.interval[0]);
    expect(r.sentence).toMatch(/^The mean of range b differs from Air temperature in range a by /);
    expect(r.method).toMatchObject({ stepS: 600, agg: 'mean' });
    expect(r.method.references.join(' ')).toContain('Zwiers & von Storch (1995)');
  });

  it('compares the same range of two channels (otherChannel)', async () => {
    const whole = `aFrom=${T0}&aTo=${T0 + N * STEP}&bFrom=${T0}&bTo=${T0 + N * STEP}`;
    const res = await request(t.app).get(`${base}/comparison?${whole}&otherChannel=${soilId}`).set('Cookie', cookie).expect(200);
    expect(res.body.other).toMatchObject({ id: soilId, key: 'soil_m' });
    expect(res.body.b.n).toBe(N);
    expect(res.body.a.n).toBe(N - 5);
    expect(res.body.sentence).toMatch(/^The mean of Soil moisture in range b differs from Air temperature in range a by /);
  });

  it('answers 400 with `field: reason`, 422 for a range without readings, 404 for another lab’s channel', async () => {
    const bad = async (query: string, message: string) => {
      const res = await request(t.app).get(`${base}/comparison?${query}`).set('Cookie', cookie).expect(400);
      expect(res.body.error.message).toBe(message);
    };
    await bad(`aTo=${T0}&bFrom=${T0}&bTo=${T0 + STEP}`, 'Start of range A: is required: a date and time with its zone, such as 2026-11-20T00:00+01:00.');
    await bad(`aFrom=${T0 + STEP}&aTo=${T0}&bFrom=${T0}&bTo=${T0 + STEP}`, 'End of range A: must be after the start of its range.');
    await bad(`${ranges}&agg=mode`, 'Summary of each step: must be mean, median, last, lowest or highest.');
    const empty = await request(t.app)
      .get(`${base}/comparison?aFrom=${T0 - 10 * STEP}&aTo=${T0 - STEP}&bFrom=${T0}&bTo=${half}`)
      .set('Cookie', cookie)
      .expect(422);
    expect(empty.body.error.message).toBe('Air temperature has no readings in range A.');
    const few = await request(t.app)
      .get(`${base}/comparison?aFrom=${T0}&aTo=${T0 + 4 * STEP}&bFrom=${T0}&bTo=${half}`)
      .set('Cookie', cookie)
      .expect(422);
    expect(few.body.error).toEqual({
      code: 'analysis_input',
      message: 'Range A gave 4 values in 1-minute steps; comparing means needs at least 10 in each range. Choose a longer range or a shorter step.',
    });
    const other = await buildLabWithEverything(t.db);
    await request(t.app).get(`${base}/comparison?${ranges}&otherChannel=${other.ids.channelId}`).set('Cookie', cookie).expect(404);
  });
});

describe('GET /channels/:channelId/diagnostics.csv', () => {
  it('exports the correlogram with both bands, the CCF and the Ljung–Box table as one RFC 4180 table', async () => {
    const query = `${range}&step=600&decomposition=none&maxLag=20&ccfWith=${soilId}&ccfMaxLag=3`;
    const res = await request(t.app).get(`${base}/diagnostics.csv?${query}`).set('Cookie', cookie).expect(200);
    const report = (await request(t.app).get(`${base}/diagnostics?${query}`).set('Cookie', cookie).expect(200)).body;
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${f.lab.slug}-air_t-diagnostics.csv"`);
    const lines = res.text.split('\r\n');
    expect(lines[0]).toBe(
      'section,lag,acf,pacf,white_noise_band,bartlett_band,ccf,ccf_band,ljung_box_statistic,ljung_box_df,ljung_box_p_value,cell,time_utc,trend,seasonal,remainder,robustness_weight,remainder_outlier,' +
        'ccf_simultaneous_band,term,estimate,standard_error,interval_low,interval_high,aicc,bic,log_likelihood,note',
    );
    expect(lines[1]).toBe(`correlogram,0,1${','.repeat(25)}`);
    const rows = parseCsv(res.text, { columns: true }) as Array<Record<string, string>>;
    const lag2 = rows[2];
    expect([lag2.lag, lag2.acf, lag2.pacf, lag2.white_noise_band, lag2.bartlett_band].map(Number)).toEqual([
      2,
      report.acf.values[2],
      report.pacf.values[1],
      report.bands.whiteNoise,
      report.bands.bartlett[1],
    ]);
    expect(rows.filter((r) => r.section === 'correlogram')).toHaveLength(21);
    const ccf = rows.filter((r) => r.section === 'ccf');
    expect(ccf.map((r) => Number(r.ccf))).toEqual(report.crossCorrelation.values);
    expect(ccf.every((r) => Number(r.ccf_simultaneous_band) === report.crossCorrelation.simultaneousBand && r.note.startsWith('prewhitened by the AR('))).toBe(
      true,
    );
    expect(rows.filter((r) => r.section === 'ccf-raw').map((r) => Number(r.ccf))).toEqual(report.crossCorrelation.raw.values);
    const box = rows.filter((r) => r.section === 'ljung-box');
    expect(box.map((b) => Number(b.lag))).toEqual(report.ljungBox.map((b: { lag: number }) => b.lag));
    expect(Number(box[0].ljung_box_statistic)).toBe(report.ljungBox[0].statistic);
    // the process model: every coefficient with its standard error, every candidate, the residual test
    const model = report.processModel;
    const coefficients = rows.filter((r) => r.section === 'model-coefficient');
    expect(coefficients.filter((r) => /^(ar|ma)\d$/.test(r.term)).map((r) => [r.term, Number(r.estimate), Number(r.standard_error)])).toEqual([
      ...model.chosen.ar.map((v: number, i: number) => [`ar${i + 1}`, v, model.chosen.standardErrors.ar[i]]),
      ...model.chosen.ma.map((v: number, i: number) => [`ma${i + 1}`, v, model.chosen.standardErrors.ma[i]]),
    ]);
    expect(rows.filter((r) => r.section === 'model-candidate')).toHaveLength(model.candidates.length);
    expect(rows.find((r) => r.section === 'model-candidate' && r.note === 'chosen')?.term).toBe(`ARMA(${model.chosen.p},${model.chosen.q})`);
    expect(Number(rows.find((r) => r.section === 'model-residual-test')?.ljung_box_p_value)).toBe(model.residualTest.pValue);
    // the trend with both intervals, and what each assumes
    const trend = rows.find((r) => r.section === 'trend')!;
    expect([Number(trend.estimate), Number(trend.interval_low), Number(trend.interval_high)]).toEqual([
      report.trend.perDay.slope,
      ...report.trend.perDay.hacInterval,
    ]);
    expect(trend.note).toContain(`Newey–West standard error, Bartlett lag ${report.trend.lag}`);
    expect(Number(rows.find((r) => r.section === 'trend-independent')!.interval_low)).toBe(report.trend.perDay.olsInterval[0]);
    expect(lines.some((l) => l.startsWith('decomposition,'))).toBe(false);
  });

  it('adds every cell of the decomposition, even where the JSON answer thins it for drawing', async () => {
    const query = `${range}&step=60&period=1440&decomposition=stl-robust&maxLag=20`;
    const res = await request(t.app).get(`${base}/diagnostics.csv?${query}`).set('Cookie', cookie).expect(200);
    const engine = channelDiagnostics(air, engineOptions({ step: 60_000, period: 1440, decomposition: 'stl-robust', maxLag: 20 }));
    if (engine.decomposition.method === 'none') throw new Error('expected a decomposition');
    const rows = res.text
      .split('\r\n')
      .filter((l) => l.startsWith('decomposition,'))
      .map((l) => l.split(','));
    expect(rows).toHaveLength(engine.grid.n);
    const outliers = new Set(engine.decomposition.outliers.indices);
    expect(outliers.size).toBeGreaterThan(0);
    for (const i of [0, 1, 4321, engine.grid.n - 1, ...outliers]) {
      const row = rows[i];
      expect(Number(row[11])).toBe(i);
      expect(row[12]).toBe(new Date(engine.grid.start + i * 60_000).toISOString());
      expect(row.slice(13, 17).map(Number)).toEqual([
        engine.decomposition.trend[i],
        engine.decomposition.seasonal[i],
        engine.decomposition.remainder[i],
        engine.decomposition.weights![i],
      ]);
      expect(row[17]).toBe(outliers.has(i) ? '1' : '0');
    }
  });
});
