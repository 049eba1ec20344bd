import type { Response } from 'express';
import { callerIdOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { csvLine } from '../csv-field.ts';
import { channelParams, comparisonQuery, diagnosticsQuery, readingsExportQuery, seriesQuery } from './channels.schema.ts';
import { presentChannelDetail, presentChannelOverview } from './channels.presenter.ts';
import { diagnosticsCsvLines } from './diagnostics-csv.ts';
import type { ChannelsService } from '../../services/channels.service.ts';
import type { DiagnosticsService } from '../../services/diagnostics.service.ts';
import type { DiagnosticsConcurrency } from '../../services/diagnostics-concurrency.ts';
import { MAX_DRAWN_CELLS, type DiagnosticsReport } from '../../services/diagnostics-report.ts';
import type { LabRoute } from '../lab-routes.ts';
import { withinPlanHistory, type HistoryWindow } from './plan-history.ts';

/** Writes a chunk, waiting for the socket to drain when its buffer is full (streamed exports). */
async function writeChunk(res: Response, chunk: string): Promise<void> {
  if (!res.write(chunk)) await new Promise<void>((resolve) => res.once('drain', resolve).once('close', resolve));
}

/** An AbortSignal that fires when the client goes away before the answer is complete. */
function signalOnDisconnect(res: Response): AbortSignal {
  const controller = new AbortController();
  res.once('close', () => {
    if (!res.writableFinished) controller.abort();
  });
  return controller.signal;
}

/** The refusal the per-person diagnostics cap gives, for the API document. */
const DIAGNOSTICS_BUSY = {
  '429': '`diagnostics_busy`: you already have as many diagnostics runs in flight as one person may (LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON, default 2, per app process); the message names them and Retry-After says when to try again.',
};

/** Headers of a CSV download named `<name>.csv` (characters outside [A-Za-z0-9_.-] become "-"). */
function csvDownload(res: Response, name: string): void {
  res.set('Content-Type', 'text/csv; charset=utf-8');
  res.set('Content-Disposition', `attachment; filename="${name.replace(/[^A-Za-z0-9_.-]+/g, '-')}.csv"`);
}

/** The channel browser: overview, detail, chart series, diagnostics and exports. */
export function channelRoutes(deps: { channels: ChannelsService; diagnostics: DiagnosticsService; now?: () => number; historyWindow?: HistoryWindow; diagnosticsRuns?: DiagnosticsConcurrency }): LabRoute[] {
  const { channels, diagnostics } = deps;
  const now = deps.now ?? Date.now;

  /**
   * Runs diagnostics; undefined when the client left first (the engine task was aborted).
   * Holds one of the person's diagnostics slots meanwhile (429 when they have none free).
   */
  async function runDiagnostics(req: Parameters<LabRoute['handle']>[0], res: Response, resolution: 'drawing' | 'full' = 'drawing') {
    const { channelId } = parseInput(channelParams, req.params);
    const params = await withinPlanHistory(deps.historyWindow, labOf(res), parseInput(diagnosticsQuery(now), req.query), res);
    const leave = deps.diagnosticsRuns?.enter(callerIdOf(res), `channel '${(await channels.requireChannel(labOf(res), channelId)).label}'`);
    const signal = signalOnDisconnect(res);
    try {
      return { channelId, ...(await diagnostics.report(labOf(res), channelId, params, signal, resolution)) };
    } catch (err) {
      if (signal.aborted) return undefined;
      throw err;
    } finally {
      leave?.();
    }
  }

  return [
    {
      method: 'get',
      path: '/channels',
      permission: 'channels.read',
      summary: 'Every live channel with its status, last reading and a 24-hour sparkline.',
      handle: async (_req, res) => {
        res.json({ channels: (await channels.overview(labOf(res))).map(presentChannelOverview), now: now() });
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId',
      permission: 'channels.read',
      summary: 'One channel with its first and last reading and reading count.',
      handle: async (req, res) => {
        const { channelId } = parseInput(channelParams, req.params);
        res.json({ channel: presentChannelDetail(await channels.detail(labOf(res), channelId)) });
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/series',
      permission: 'channels.read',
      summary: "A channel's readings, or min/max buckets from rollups, for charting.",
      query: seriesQuery(now),
      handle: async (req, res) => {
        const { channelId } = parseInput(channelParams, req.params);
        const asked = parseInput(seriesQuery(now), req.query);
        const q = await withinPlanHistory(deps.historyWindow, labOf(res), asked, res);
        res.json({
          channelId,
          requested: { from: asked.from, to: asked.to, points: asked.points },
          // set when the plan's history window cut the start of the range (older readings are kept)
          historyStartsAt: q.from !== asked.from ? q.from : null,
          series: await channels.series(labOf(res), channelId, q),
        });
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/diagnostics',
      permission: 'diagnostics.read',
      summary:
        `ACF, PACF, Ljung–Box, process identification with the fitted ARMA model (\`processModel\`: coefficients ± standard errors, candidates with AICc and BIC, residual test), the trend with Newey–West and naive intervals (\`trend\`), STL, effective sample size and the prewhitened cross-correlation with a simultaneous band (\`crossCorrelation\`, the raw CCF under \`raw\`) for a channel. A decomposition longer than ${MAX_DRAWN_CELLS.toLocaleString('en')} cells comes thinned for drawing (\`decomposition.cells\` lists the cells kept, \`decomposition.thinned\` says how); diagnostics.csv holds every cell.`,
      query: diagnosticsQuery(now),
      responses: DIAGNOSTICS_BUSY,
      handle: async (req, res) => {
        const outcome = await runDiagnostics(req, res);
        if (!outcome) return;
        // The cached bytes are the report without the flag: write the flag, then the report from
        // after its opening brace (no copy, no re-encoding, no ETag hashing of megabytes).
        const head = Buffer.from(`{"cached":${outcome.cached},`);
        res.set('Content-Type', 'application/json; charset=utf-8');
        res.set('Content-Length', String(head.length + outcome.json.length - 1));
        res.write(head);
        res.end(outcome.json.subarray(1));
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/comparison',
      permission: 'diagnostics.read',
      summary:
        'Before/after comparison of means: range a of this channel against range b of `otherChannel` (this channel when left out), mean(b) − mean(a) with an interval from each range’s effective sample size beside the naive Welch interval.',
      query: comparisonQuery,
      responses: {
        ...DIAGNOSTICS_BUSY,
        '422': '`analysis_input`: a range holds no readings, fewer than 10, or fewer than 2 effective readings, or both ranges are constant; the message says which.',
      },
      handle: async (req, res) => {
        const { channelId } = parseInput(channelParams, req.params);
        const lab = labOf(res);
        // another lab's channel answers 404 whatever the query holds
        const channel = await channels.requireChannel(lab, channelId);
        const q = parseInput(comparisonQuery, req.query);
        const a = await withinPlanHistory(deps.historyWindow, lab, { from: q.aFrom, to: q.aTo }, res);
        const b = await withinPlanHistory(deps.historyWindow, lab, { from: q.bFrom, to: q.bTo }, res);
        const leave = deps.diagnosticsRuns?.enter(callerIdOf(res), `a comparison on channel '${channel.label}'`);
        const signal = signalOnDisconnect(res);
        try {
          res.json(await diagnostics.comparison(lab, channelId, { ...q, aFrom: a.from, aTo: a.to, bFrom: b.from, bTo: b.to }, signal));
        } catch (err) {
          if (signal.aborted) return;
          throw err;
        } finally {
          leave?.();
        }
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/readings.csv',
      permission: 'exports.create',
      summary: "A channel's raw readings as CSV.",
      query: readingsExportQuery(now),
      handle: async (req, res) => {
        const { channelId } = parseInput(channelParams, req.params);
        const q = await withinPlanHistory(deps.historyWindow, labOf(res), parseInput(readingsExportQuery(now), req.query), res);
        const lab = labOf(res);
        const channel = await channels.requireChannel(lab, channelId);
        csvDownload(res, `${lab.slug}-${channel.key}-readings`);
        await writeChunk(res, csvLine(['time_utc', 'epoch_ms', 'value']));
        for await (const page of channels.readingPages(lab, channelId, q)) {
          if (res.destroyed) return;
          let chunk = '';
          for (let i = 0; i < page.ts.length; i++) chunk += csvLine([new Date(page.ts[i]).toISOString(), page.ts[i], page.values[i]]);
          await writeChunk(res, chunk);
        }
        res.end();
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/diagnostics.csv',
      permission: 'exports.create',
      summary: "A channel's correlogram, cross-correlation, Ljung–Box and full-resolution decomposition tables as CSV.",
      query: diagnosticsQuery(now),
      responses: DIAGNOSTICS_BUSY,
      handle: async (req, res) => {
        const outcome = await runDiagnostics(req, res, 'full');
        if (!outcome) return;
        const report = JSON.parse(outcome.json.toString('utf8')) as DiagnosticsReport;
        csvDownload(res, `${labOf(res).slug}-${report.channel.key}-diagnostics`);
        // A full-resolution decomposition adds a row per cell: stream it in pieces.
        let chunk = '';
        for (const line of diagnosticsCsvLines(report)) {
          chunk += line;
          if (chunk.length < 64 * 1024) continue;
          if (res.destroyed) return;
          await writeChunk(res, chunk);
          chunk = '';
        }
        res.end(chunk);
      },
    },
  ];
}
