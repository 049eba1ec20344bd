import { createHash } from 'node:crypto';
import type { Db } from '../db/create-db.ts';
import { inLab, type LabScope } from '../db/tenant-scope.ts';
import { createReadReplica, type ReadReplica } from '../db/read-replica.ts';
import { channelReadingsRepo, type ReadingColumns } from '../db/channel-readings.repo.ts';
import type { ChannelWithState } from '../db/channel-state.repo.ts';
import { ROLLUP_RESOLUTIONS_S } from '../db/readings.repo.ts';
import { isKept } from '../db/rollup-levels.ts';
import {
  AnalysisInputError,
  channelDiagnostics,
  rangeComparison,
  type ChannelDiagnostics,
  type ChannelDiagnosticsOptions,
  type ChannelReadings,
  type CompareMeansResult,
  type RangeComparisonOptions,
} from '../analysis/index.ts';
import type { AnalysisPool } from '../workers/analysis-pool.ts';
import type { AnalysisResult, AnalysisTask } from '../workers/analysis-registry.ts';
import { AppError, ValidationError } from '../errors.ts';
import type { ChannelsService } from './channels.service.ts';
import type { LabContext } from './lab-context.ts';
import { createResultCache, type ResultCacheOptions } from './result-cache.ts';
import type { ComparisonAnswer, ComparisonParams, DiagnosticsParams, GridSource } from '../contract/diagnostics.ts';
import { analysisRefusal, DIAGNOSTICS_FIELD_LABELS, DIAGNOSTICS_MESSAGES, type RefusalContext } from '../contract/words/diagnostics.ts';
import { problemsMessage } from '../contract/words/fields.ts';
import { diagnosticsReport, type DecompositionResolution } from './diagnostics-report.ts';
import { rangeComparisonReport } from './range-comparison-report.ts';
import { excludedNotes, type ExcludedNote } from './notes/notes.service.ts';
import { leaveOutNotedCells } from './notes/leave-out-noted-cells.ts';
import type { AppliedNote } from '../contract/notes.ts';

/** The engine refused the data or a parameter for it (too few readings, a period too long …). */
export class AnalysisRefusedError extends AppError {
  constructor(message: string) {
    super(422, 'analysis_input', message);
  }
}

/** At most this many grid cells per run: keeps one request from occupying a worker for long. */
export const MAX_DIAGNOSTICS_CELLS = 300_000;

const DEFAULT_CACHE: ResultCacheOptions = { maxEntries: 64, maxBytes: 128 * 1024 * 1024, maxAgeMs: 15 * 60_000 };
/** Grids read from the database, kept for the next request on the same range with other parameters. */
const DEFAULT_GRID_CACHE: ResultCacheOptions = { maxEntries: 16, maxBytes: 64 * 1024 * 1024, maxAgeMs: 15 * 60_000 };

/** One channel's cells for a range, as read, and where they came from. */
interface LoadedGrid {
  data: ReadingColumns;
  source: GridSource;
  /** Readings summarised in each cell of `data` (same order) when the cells come from rollups; null when `data` holds the readings themselves. */
  counts: Float64Array | null;
}

/**
 * How many readings a loaded grid stands for: its rows when they are raw readings, else the
 * rollups' reading counts of the cells it still holds (a cell left out under a note drops its
 * readings too), so a report never calls an hourly cell one reading.
 */
function readingsIn(loaded: LoadedGrid, kept: ReadingColumns): number {
  if (loaded.counts === null) return kept.ts.length;
  let total = 0;
  for (let i = 0, j = 0; i < kept.ts.length; i++) {
    while (j < loaded.data.ts.length && loaded.data.ts[j] < kept.ts[i]) j++;
    if (j < loaded.data.ts.length && loaded.data.ts[j] === kept.ts[i]) total += loaded.counts[j];
  }
  return total;
}

/** A fingerprint of the notes a run leaves out, for cache keys: any change to one of them changes it. */
function notesFingerprint(...lists: ExcludedNote[][]): string {
  if (lists.every((l) => l.length === 0)) return '';
  return createHash('sha256').update(JSON.stringify(lists)).digest('base64url');
}

/**
 * A loaded grid with the cells of `notes` (marked "leave out of analysis") made missing, and
 * what each note took away. The grid cache keeps the readings as read; this runs per request.
 */
function withoutNotedCells(grid: LoadedGrid, notes: ExcludedNote[], stepMs: number, channelId: number): { grid: LoadedGrid; applied: AppliedNote[] } {
  if (notes.length === 0) return { grid, applied: [] };
  const { data, cellsRemoved } = leaveOutNotedCells(grid.data, notes, stepMs);
  const applied = notes.map((n, i) => ({
    id: n.id,
    kind: n.kind,
    text: n.text,
    channelId: n.channelId,
    removedFrom: channelId,
    from: n.start,
    to: n.end,
    cellsRemoved: cellsRemoved[i],
  }));
  return { grid: { ...grid, data }, applied };
}

/**
 * Channel diagnostics: loads one channel's grid for a range (from exact rollup cells when the
 * step allows, else raw readings), runs the whole engine bundle as one worker-pool task (or in
 * process when no pool is given) and caches the serialised report. The cache key holds the
 * channel, range, every parameter and the data version of the channel (and of the CCF partner),
 * read before the readings: a batch that stores new readings bumps the version, so a later
 * request never gets a result computed without them. The grids read are cached apart, under
 * the same data version: another differencing, lag or decomposition on the same range runs the
 * engine again without reading the database again. The grid is read through `reads` (the
 * reader when its data version of the channel is at least the one in the key, else the writer;
 * see read-replica.ts), so neither cache ever holds an answer older than its key; the channel
 * rows and the notes come from the writer `db`.
 */
export function createDiagnosticsService(deps: {
  db: Db;
  reads?: ReadReplica;
  channels: ChannelsService;
  pool?: AnalysisPool;
  cache?: Partial<ResultCacheOptions>;
  gridCache?: Partial<ResultCacheOptions>;
}) {
  const reads = deps.reads ?? createReadReplica({ writer: deps.db });
  const cache = createResultCache({ ...DEFAULT_CACHE, ...deps.cache });
  const grids = createResultCache<LoadedGrid>({
    ...DEFAULT_GRID_CACHE,
    ...deps.gridCache,
    sizeOf: (g) => g.data.ts.byteLength + g.data.values.byteLength + (g.counts?.byteLength ?? 0),
  });

  /**
   * One channel's values on the step grid of [from, to), from memory when the same channel,
   * data version, range, step and aggregate were read lately (the panel's other parameters
   * change nothing here), else from the database.
   */
  async function load(
    lab: LabContext,
    channel: ChannelWithState,
    range: { from: number; to: number },
    stepMs: number,
    agg: DiagnosticsParams['agg'],
  ): Promise<LoadedGrid> {
    const key = JSON.stringify([lab.id, channel.id, channel.dataVersion, range, stepMs, agg]);
    const kept = grids.get(key);
    if (kept) return kept;
    const grid = await reads.channelRead(lab.id, [channel], (db) => read(inLab(db, lab.id), channel.id, range, stepMs, agg));
    grids.set(key, grid);
    return grid;
  }

  /** One channel's values on the step grid of [from, to): exact rollup cells when possible. */
  async function read(
    scope: LabScope,
    channelId: number,
    range: { from: number; to: number },
    stepMs: number,
    agg: DiagnosticsParams['agg'],
  ): Promise<LoadedGrid> {
    const repo = channelReadingsRepo(scope);
    // The coarsest level the channel keeps whose cells tile the step (none kept: raw readings).
    const floor = agg === 'mean' || agg === 'min' || agg === 'max' ? ((await repo.rollupFloors([channelId])).get(channelId) ?? null) : null;
    const resolutionS = [...ROLLUP_RESOLUTIONS_S].reverse().find((r) => isKept(r, floor) && stepMs % (r * 1000) === 0);
    if (resolutionS && (agg === 'mean' || agg === 'min' || agg === 'max')) {
      const [data, buckets] = await Promise.all([
        repo.cellsFromRollups(channelId, resolutionS, range.from, range.to, stepMs, agg),
        repo.rollupBuckets(channelId, resolutionS, range.from, range.to, stepMs),
      ]);
      const countAt = new Map(buckets.map((b) => [b.start, b.count]));
      const counts = Float64Array.from(data.ts, (ts) => countAt.get(ts) ?? 0);
      return { data, source: { kind: 'rollups', resolutionS }, counts };
    }
    return { data: await repo.rangeForGrid(channelId, range.from, range.to, stepMs), source: { kind: 'readings' }, counts: null };
  }

  /**
   * Runs one engine task on the pool (in process without one); the engine's refusals become 422
   * with the catalogue's plain sentence for their typed reason (the engine's own message is for
   * developers and never reaches the answer).
   */
  async function runEngine<T extends AnalysisTask>(
    task: T,
    inProcess: () => AnalysisResult<T>,
    words: RefusalContext,
    signal?: AbortSignal,
  ): Promise<AnalysisResult<T>> {
    try {
      if (deps.pool) return await deps.pool.run(task, { signal });
      return inProcess();
    } catch (err) {
      if (err instanceof AnalysisInputError) throw new AnalysisRefusedError(analysisRefusal(err.detail, words));
      throw err;
    }
  }

  const compute = (
    readings: ChannelReadings,
    options: ChannelDiagnosticsOptions,
    partner: ChannelReadings | undefined,
    signal?: AbortSignal,
  ): Promise<ChannelDiagnostics> =>
    runEngine(
      { fn: 'channelDiagnostics', args: [readings, options, partner] },
      () => channelDiagnostics(readings, options, partner),
      { stepS: options.step / 1000, difference: options.difference ?? 0, seasonalDifference: options.seasonalDifference ?? 0 },
      signal,
    );

  const compare = (a: ChannelReadings, b: ChannelReadings, options: RangeComparisonOptions, signal?: AbortSignal): Promise<CompareMeansResult> =>
    runEngine(
      { fn: 'rangeComparison', args: [a, b, options] },
      () => rangeComparison(a, b, options),
      { stepS: options.step / 1000, difference: 0, seasonalDifference: 0 },
      signal,
    );

  /** A range aligned outward to whole steps, refused when it holds more cells than one run may. */
  function alignedRange(from: number, to: number, stepMs: number, field: 'aTo' | 'bTo' | 'step'): { from: number; to: number } {
    const range = { from: Math.floor(from / stepMs) * stepMs, to: Math.ceil(to / stepMs) * stepMs };
    const cells = (range.to - range.from) / stepMs;
    if (cells > MAX_DIAGNOSTICS_CELLS) {
      const problem = { field, label: DIAGNOSTICS_FIELD_LABELS[field], reason: DIAGNOSTICS_MESSAGES.tooManySteps(cells, stepMs / 1000, MAX_DIAGNOSTICS_CELLS) };
      throw new ValidationError(problemsMessage([problem]), [problem]);
    }
    return range;
  }

  /** The notes marked "leave out of analysis" on a channel or its logger overlapping a range. */
  const notesOf = (lab: LabContext, channel: ChannelWithState, range: { from: number; to: number }): Promise<ExcludedNote[]> =>
    excludedNotes(inLab(deps.db, lab.id), { id: channel.id, loggerId: channel.loggerId }, range.from, range.to);

  return {
    /**
     * Before/after comparison: the mean of range b (of `otherChannel`, or this channel) against
     * the mean of range a of this channel, with the interval from each range's effective sample
     * size beside the naive Welch one, on the diagnostics grid (step and aggregate as there).
     * Cells under notes marked "leave out of analysis" are missing in both ranges.
     */
    async comparison(lab: LabContext, channelId: number, params: ComparisonParams, signal?: AbortSignal): Promise<ComparisonAnswer> {
      const channel = await deps.channels.requireChannel(lab, channelId);
      const other = params.otherChannel === undefined ? null : await deps.channels.requireChannel(lab, params.otherChannel);
      const stepS = params.step ?? channel.expectedIntervalS ?? channel.logger.expectedIntervalS;
      const stepMs = stepS * 1000;
      const rangeA = alignedRange(params.aFrom, params.aTo, stepMs, 'aTo');
      const rangeB = alignedRange(params.bFrom, params.bTo, stepMs, 'bTo');
      const [loadedA, loadedB, notesA, notesB] = await Promise.all([
        load(lab, channel, rangeA, stepMs, params.agg),
        load(lab, other ?? channel, rangeB, stepMs, params.agg),
        notesOf(lab, channel, rangeA),
        notesOf(lab, other ?? channel, rangeB),
      ]);
      const leftA = withoutNotedCells(loadedA, notesA, stepMs, channel.id);
      const leftB = withoutNotedCells(loadedB, notesB, stepMs, (other ?? channel).id);
      const [a, b] = [leftA.grid, leftB.grid];
      if (a.data.ts.length === 0) throw new AnalysisRefusedError(DIAGNOSTICS_MESSAGES.rangeNoReadings('a', channel.label, leftA.applied.length > 0));
      if (b.data.ts.length === 0) {
        throw new AnalysisRefusedError(DIAGNOSTICS_MESSAGES.rangeNoReadings('b', (other ?? channel).label, leftB.applied.length > 0));
      }
      const asReadings = (d: ReadingColumns): ChannelReadings => ({ timestamps: d.ts, values: d.values });
      const result = await compare(asReadings(a.data), asReadings(b.data), { step: stepMs, agg: params.agg, alpha: params.alpha }, signal);
      return rangeComparisonReport({ channel, other, params, stepS, rangeA, rangeB, result, excludedNotes: { a: leftA.applied, b: leftB.applied } });
    },

    /**
     * The diagnostics report of one channel as UTF-8 JSON, and whether it came from the cache
     * (kept encoded, so a cache hit costs no serialising or re-encoding).
     * `signal` cancels the engine run (the client went away). `resolution` 'drawing' (default)
     * thins a long decomposition for charts; 'full' keeps every cell (the CSV export). Each is
     * cached on its own. Cells under notes marked "leave out of analysis" (on either channel or
     * its logger) are missing values; the notes' fingerprint is part of the cache key, so a
     * note made, changed or deleted is never answered from a result computed without it.
     */
    async report(
      lab: LabContext,
      channelId: number,
      params: DiagnosticsParams,
      signal?: AbortSignal,
      resolution: DecompositionResolution = 'drawing',
    ): Promise<{ json: Buffer; cached: boolean }> {
      const channel = await deps.channels.requireChannel(lab, channelId);
      const partner: ChannelWithState | null = params.ccfWith === undefined ? null : await deps.channels.requireChannel(lab, params.ccfWith);
      const stepS = params.step ?? channel.expectedIntervalS ?? channel.logger.expectedIntervalS;
      const stepMs = stepS * 1000;
      const range = alignedRange(params.from, params.to, stepMs, 'step');
      const [mainNotes, partnerNotes] = await Promise.all([notesOf(lab, channel, range), partner ? notesOf(lab, partner, range) : []]);
      const key = JSON.stringify([
        lab.id,
        channelId,
        channel.dataVersion,
        partner?.id ?? null,
        partner?.dataVersion ?? null,
        range,
        stepS,
        params,
        resolution,
        notesFingerprint(mainNotes, partnerNotes),
      ]);
      const hit = cache.get(key);
      if (hit !== undefined) return { json: hit, cached: true };

      const [loadedMain, loadedOther] = await Promise.all([
        load(lab, channel, range, stepMs, params.agg),
        partner ? load(lab, partner, range, stepMs, params.agg) : null,
      ]);
      const leftMain = withoutNotedCells(loadedMain, mainNotes, stepMs, channel.id);
      const leftOther = loadedOther && partner ? withoutNotedCells(loadedOther, partnerNotes, stepMs, partner.id) : null;
      const main = leftMain.grid;
      const other = leftOther?.grid ?? null;
      const applied = [...leftMain.applied, ...(leftOther?.applied ?? [])];
      if (main.data.ts.length === 0) {
        throw new AnalysisRefusedError(leftMain.applied.length ? DIAGNOSTICS_MESSAGES.noReadingsOutsideNotes : DIAGNOSTICS_MESSAGES.noReadings);
      }
      if (other && other.data.ts.length === 0) throw new AnalysisRefusedError(DIAGNOSTICS_MESSAGES.partnerNoReadings);
      const options: ChannelDiagnosticsOptions = {
        step: stepMs,
        agg: params.agg,
        difference: params.difference,
        seasonalDifference: params.seasonalDifference,
        period: params.period,
        decomposition: params.decomposition,
        alpha: params.alpha,
        ...(params.maxLag !== undefined ? { maxLag: params.maxLag } : {}),
        ...(params.ccfMaxLag !== undefined ? { ccfMaxLag: params.ccfMaxLag } : {}),
        labels: { channel: channel.label, partner: partner?.label ?? '' },
      };
      const asReadings = (d: ReadingColumns): ChannelReadings => ({ timestamps: d.ts, values: d.values });
      const result = await compute(asReadings(main.data), options, other ? asReadings(other.data) : undefined, signal);
      const json = Buffer.from(
        JSON.stringify(
          diagnosticsReport({
            channel,
            partner,
            params,
            range,
            stepS,
            source: main.source,
            readings: readingsIn(loadedMain, main.data),
            result,
            resolution,
            excludedNotes: applied,
          }),
        ),
      );
      cache.set(key, json);
      return { json, cached: false };
    },
  };
}

export type DiagnosticsService = ReturnType<typeof createDiagnosticsService>;
