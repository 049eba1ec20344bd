import type { RequestHandler, Response } from 'express';
import { labOf } from '../middleware/lab-guard.ts';
import { csvLine } from '../csv-field.ts';
import { wallClockText } from '../../policies/time-zones.ts';
import {
  channelParams,
  readingsExportQuery,
  seriesQuery,
  type ChannelDetailAnswer,
  type ChannelParams,
  type ChannelsAnswer,
  type SeriesAnswer,
} from '../../contract/channels.ts';
import { comparisonQuery, diagnosticsQuery, type ComparisonAnswer, type DiagnosticsParams, type DiagnosticsReport } from '../../contract/diagnostics.ts';
import { presentChannelDetail, presentChannelOverview } from './channels.presenter.ts';
import { diagnosticsCsvLines } from './diagnostics-csv.ts';
import type { ChannelsService } from '../../services/channels.service.ts';
import type { DiagnosticsService } from '../../services/diagnostics.service.ts';
import type { DiagnosticsConcurrency } from '../../services/diagnostics-concurrency.ts';
import { MAX_DRAWN_CELLS, type DecompositionResolution } from '../../services/diagnostics-report.ts';
import { defineRoute, type Route, type RouteInput } from '../routes/route.ts';
import { withinPlanHistory, type PlanHistory } from './plan-history.ts';

/** Writes a chunk, waiting for the socket to drain when its buffer is full (streamed exports). */
async function writeChunk(res: Response, chunk: string): Promise<void> {
  if (!res.write(chunk)) await new Promise<void>((resolve) => res.once('drain', resolve).once('close', resolve));
}

/**
 * An instant as ISO 8601 on the wall clock of `timeZone` with its offset
 * (`2026-03-29T03:00:00.000+02:00`; ISO 8601-1:2019 §5.3.4.2 local time with UTC difference),
 * for the readings export's column on the logger's clock.
 */
function zonedIsoTime(ms: number, timeZone: string): string {
  const wall = wallClockText(timeZone, ms);
  const offset = Math.round((Date.parse(`${wall.replace(' ', 'T')}Z`) - Math.floor(ms / 1000) * 1000) / 60_000);
  const abs = Math.abs(offset);
  const hhmm = `${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
  const millis = String(((ms % 1000) + 1000) % 1000).padStart(3, '0');
  return `${wall.replace(' ', 'T')}.${millis}${offset < 0 ? '-' : '+'}${hhmm}`;
}

/** Headers of a CSV download named `<name>.csv` (characters outside [A-Za-z0-9_.-] become "-"). */
function csvDownload(res: Response, name: string): void {
  res.set('Content-Type', 'text/csv; charset=utf-8');
  res.set('Content-Disposition', `attachment; filename="${name.replace(/[^A-Za-z0-9_.-]+/g, '-')}.csv"`);
}

/** The refusal of a range the lab's plan does not show, for the API document. */
const OUTSIDE_PLAN_HISTORY = {
  402: "`outside_plan_history`: the range lies wholly before the history the lab's plan shows (the readings are kept; a longer plan shows them). A range the window cuts at its start is answered, with Lagbook-History-Starts.",
};

/** The refusal the per-person diagnostics cap gives, for the API document. */
const DIAGNOSTICS_BUSY = {
  429: '`diagnostics_busy`: you already have as many diagnostics runs in flight as one person may (LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON, default 2, per app process); the message names them and Retry-After says when to try again.',
};

/** The errors of a diagnostics run (the JSON answer and the CSV export). */
const DIAGNOSTICS_ERRORS = {
  ...OUTSIDE_PLAN_HISTORY,
  422: '`analysis_input`: the engine cannot analyse this range with these parameters (no readings, too few values after differencing, a period too long for the range, `ccfWith` without readings); the message says which.',
  ...DIAGNOSTICS_BUSY,
};

/**
 * Answers 404 for a channel that is not in the URL's lab before the query is parsed, so another
 * lab's channel answers 404 whatever the query holds (the comparison's query has required fields,
 * which would otherwise answer 400 first). A malformed id is left to the params schema (400).
 */
function channelOfThisLab(channels: ChannelsService): RequestHandler {
  return async (req, res, next) => {
    const parsed = channelParams.safeParse(req.params);
    if (parsed.success) await channels.requireChannel(labOf(res), parsed.data.channelId);
    next();
  };
}

/** The channel browser: overview, detail, chart series, diagnostics, the comparison and the exports. */
export function channelRoutes(deps: {
  channels: ChannelsService;
  diagnostics: DiagnosticsService;
  now?: () => number;
  /** The plan-history rule (the billing service); without it every range passes unchanged. */
  billing?: PlanHistory;
  /** The per-person cap on diagnostics runs in flight; without it there is none. */
  diagnosticsRuns?: DiagnosticsConcurrency;
}): Route[] {
  const { channels, diagnostics } = deps;
  const now = deps.now ?? Date.now;

  /**
   * Runs diagnostics; undefined when the client left first (the engine task was aborted).
   * Holds one of the person's diagnostics slots meanwhile (429 when they have none free).
   */
  async function runDiagnostics(input: RouteInput<ChannelParams, DiagnosticsParams, undefined>, resolution: DecompositionResolution) {
    const { lab, signal } = input;
    const { channelId } = input.params;
    const params = await withinPlanHistory(deps.billing, lab, input.query, input.setHeader);
    const leave = deps.diagnosticsRuns?.enter(input.callerId, `channel '${(await channels.requireChannel(lab, channelId)).label}'`);
    try {
      return await diagnostics.report(lab, channelId, params, signal, resolution);
    } catch (err) {
      if (signal.aborted) return undefined;
      throw err;
    } finally {
      leave?.();
    }
  }

  return [
    defineRoute({
      method: 'get',
      path: '/channels',
      auth: { permission: 'channels.read' },
      summary: 'Every live channel with its status, last reading and a 24-hour sparkline.',
      response: { status: 200, description: "The channels that are not retired, and the server's clock (`now`, epoch ms)." },
      handle: async ({ lab }): Promise<ChannelsAnswer> => ({ channels: (await channels.overview(lab)).map(presentChannelOverview), now: now() }),
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId',
      auth: { permission: 'channels.read' },
      summary: 'One channel with its first and last reading and reading count.',
      params: channelParams,
      response: { status: 200, description: 'The channel with its logger, status and the extent of its readings.' },
      handle: async ({ lab, params }): Promise<ChannelDetailAnswer> => ({ channel: presentChannelDetail(await channels.detail(lab, params.channelId)) }),
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/series',
      auth: { permission: 'channels.read' },
      summary: "A channel's readings, or min/max buckets from rollups, for charting.",
      params: channelParams,
      query: seriesQuery(now),
      response: {
        status: 200,
        description: "The series; when the plan's history cut the start of the range, `historyStartsAt` and the Lagbook-History-Starts header say where.",
      },
      errors: OUTSIDE_PLAN_HISTORY,
      handle: async ({ lab, params, query: asked, setHeader }): Promise<SeriesAnswer> => {
        const q = await withinPlanHistory(deps.billing, lab, asked, setHeader);
        return {
          channelId: params.channelId,
          requested: { from: asked.from, to: asked.to, points: asked.points },
          // set when the plan's history window cut the start of the range (older readings are kept)
          historyStartsAt: q.from !== asked.from ? q.from : null,
          series: await channels.series(lab, params.channelId, q),
        };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/diagnostics',
      auth: { permission: 'diagnostics.read' },
      summary: `ACF, PACF, Ljung–Box, process identification with the fitted ARMA model (\`processModel\`: coefficients ± standard errors, candidates with AICc and BIC, residual test), the trend with Newey–West and naive intervals (\`trend\`), STL, effective sample size and the prewhitened cross-correlation with a simultaneous band (\`crossCorrelation\`, the raw CCF under \`raw\`) for a channel. A decomposition longer than ${MAX_DRAWN_CELLS.toLocaleString('en')} cells comes thinned for drawing (\`decomposition.cells\` lists the cells kept, \`decomposition.thinned\` says how); diagnostics.csv holds every cell.`,
      params: channelParams,
      query: diagnosticsQuery(now),
      response: { status: 200, description: 'The diagnostics report, with `cached` saying whether it came from the result cache.' },
      errors: DIAGNOSTICS_ERRORS,
      // The cached bytes are written as they are.
      stream: true,
      handle: async (input, { res }) => {
        const outcome = await runDiagnostics(input, 'drawing');
        if (!outcome) return;
        // The cached bytes are the report without the flag: write the flag, then the report from
        // after its opening brace (no copy, no re-encoding, no ETag hashing of megabytes).
        const head = Buffer.from(`{"cached":${outcome.cached},`);
        res.set('Content-Type', 'application/json; charset=utf-8');
        res.set('Content-Length', String(head.length + outcome.json.length - 1));
        res.write(head);
        res.end(outcome.json.subarray(1));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/comparison',
      auth: { permission: 'diagnostics.read' },
      summary:
        'Before/after comparison of means: range a of this channel against range b of `otherChannel` (this channel when left out), mean(b) − mean(a) with an interval from each range’s effective sample size beside the naive Welch interval.',
      params: channelParams,
      query: comparisonQuery,
      before: [channelOfThisLab(channels)],
      response: { status: 200, description: 'Both ranges summarised and the difference of their means with both intervals.' },
      errors: {
        ...OUTSIDE_PLAN_HISTORY,
        422: '`analysis_input`: a range holds no readings, fewer than 10, or fewer than 2 effective readings, or both ranges are constant; the message says which.',
        ...DIAGNOSTICS_BUSY,
      },
      handle: async ({ lab, params, query: q, setHeader, callerId, signal }): Promise<ComparisonAnswer> => {
        const a = await withinPlanHistory(deps.billing, lab, { from: q.aFrom, to: q.aTo }, setHeader);
        const b = await withinPlanHistory(deps.billing, lab, { from: q.bFrom, to: q.bTo }, setHeader);
        const channel = await channels.requireChannel(lab, params.channelId);
        const leave = deps.diagnosticsRuns?.enter(callerId, `a comparison on channel '${channel.label}'`);
        try {
          return await diagnostics.comparison(lab, params.channelId, { ...q, aFrom: a.from, aTo: a.to, bFrom: b.from, bTo: b.to }, signal);
        } finally {
          leave?.();
        }
      },
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/readings.csv',
      auth: { permission: 'exports.create' },
      summary: "A channel's raw readings as CSV.",
      params: channelParams,
      query: readingsExportQuery(now),
      response: {
        status: 200,
        description:
          "The readings of the range as CSV (time_utc, epoch_ms, value, then the time on the logger's clock with its offset in a column named time_local_<the logger's IANA zone>), streamed.",
        mediaType: 'text/csv',
      },
      errors: OUTSIDE_PLAN_HISTORY,
      stream: true,
      handle: async ({ lab, params, query, setHeader }, { res }) => {
        const q = await withinPlanHistory(deps.billing, lab, query, setHeader);
        const channel = await channels.requireChannel(lab, params.channelId);
        csvDownload(res, `${lab.slug}-${channel.key}-readings`);
        const zone = channel.logger.timezone;
        await writeChunk(res, csvLine(['time_utc', 'epoch_ms', 'value', `time_local_${zone}`]));
        for await (const page of channels.readingPages(lab, params.channelId, q)) {
          if (res.destroyed) return;
          let chunk = '';
          for (let i = 0; i < page.ts.length; i++)
            chunk += csvLine([new Date(page.ts[i]).toISOString(), page.ts[i], page.values[i], zonedIsoTime(page.ts[i], zone)]);
          await writeChunk(res, chunk);
        }
        res.end();
      },
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/diagnostics.csv',
      auth: { permission: 'exports.create' },
      summary: "A channel's correlogram, cross-correlation, Ljung–Box and full-resolution decomposition tables as CSV.",
      params: channelParams,
      query: diagnosticsQuery(now),
      response: {
        status: 200,
        description: 'The diagnostics tables as one CSV table (a `section` column tells the rows apart), streamed.',
        mediaType: 'text/csv',
      },
      errors: DIAGNOSTICS_ERRORS,
      stream: true,
      handle: async (input, { res }) => {
        const outcome = await runDiagnostics(input, 'full');
        if (!outcome) return;
        const report = JSON.parse(outcome.json.toString('utf8')) as DiagnosticsReport;
        csvDownload(res, `${input.lab.slug}-${report.channel.key}-diagnostics`);
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
    }),
  ];
}
