import {
  bulkRequestSchema,
  bulkRunParamsSchema,
  type BulkPreview,
  type BulkRun,
  type BulkRunList,
  quarantineIdsSchema,
  quarantineQuerySchema,
  quarantineResubmitSchema,
  type DiscardAnswer,
  type QuarantinePage,
  type ResubmitOutcome,
} from '../../contract/quarantine.ts';
import { presentQuarantinePage, presentResubmitOutcome } from '../presenters/loggers.presenter.ts';
import { csvLine } from '../csv-field.ts';
import type { QuarantineService } from '../../services/quarantine.service.ts';
import { filterOf } from '../../services/quarantine/filter-of.ts';
import { defineRoute, type Route } from '../routes/route.ts';

const CSV_COLUMNS = ['id', 'logger_id', 'source', 'row_index', 'reason_code', 'reason', 'channel', 'ts', 'value', 'raw', 'received_at'];

/** Quarantined rows: review, export, discard, fix and re-submit (technicians and admins). */
export function quarantineRoutes(deps: { quarantine: QuarantineService }): Route[] {
  const { quarantine } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/quarantine',
      auth: { permission: 'quarantine.review' },
      summary:
        'Quarantined rows with their reasons, newest first, in keyset pages: ask for the next page with `cursor` set to the `nextCursor` of the previous one (null on the last page). `total` counts matching rows up to 10,000 (`totalAtLeast` is true when there are at least that many).',
      query: quarantineQuerySchema,
      response: { status: 200, description: 'One page of quarantined rows with the cursor of the next one.' },
      handle: async ({ lab, query }): Promise<QuarantinePage> =>
        presentQuarantinePage(await quarantine.list(lab, { ...filterOf(query), after: query.cursor, pageSize: query.pageSize }), query.pageSize),
    }),
    defineRoute({
      method: 'get',
      path: '/quarantine/export.csv',
      auth: { permission: 'quarantine.review' },
      summary: 'Quarantined rows as a CSV file (every matching row; text cells that a spreadsheet would read as a formula start with an apostrophe).',
      query: quarantineQuerySchema,
      response: { status: 200, description: 'Every matching row as CSV (header row first).', mediaType: 'text/csv' },
      stream: true,
      handle: async ({ lab, query }, { res }) => {
        res.set('Content-Type', 'text/csv; charset=utf-8');
        res.set('Content-Disposition', `attachment; filename="${lab.slug}-quarantine.csv"`);
        res.write(csvLine(CSV_COLUMNS));
        for await (const rows of quarantine.all(lab, filterOf(query))) {
          for (const r of rows) {
            res.write(
              csvLine([r.id, r.loggerId, r.source, r.rowIndex, r.reasonCode, r.reason, r.channelKey, r.tsRaw, r.valueRaw, r.raw, r.receivedAt.toISOString()]),
            );
          }
        }
        res.end();
      },
    }),
    defineRoute({
      method: 'post',
      path: '/quarantine/discard',
      auth: { permission: 'quarantine.review' },
      summary: 'Discard quarantined rows.',
      body: quarantineIdsSchema,
      response: { status: 200, description: 'How many rows were deleted (recorded in the audit log).' },
      handle: async ({ lab, actor, body }): Promise<DiscardAnswer> => ({ discarded: await quarantine.discard(lab, actor, body.ids) }),
    }),
    defineRoute({
      method: 'post',
      path: '/quarantine/resubmit',
      auth: { permission: 'quarantine.review' },
      summary: 'Fix quarantined rows and send them through ingestion again.',
      body: quarantineResubmitSchema,
      response: { status: 200, description: 'What became of the rows; those that failed again are named by their old id, with the new reason.' },
      errors: {
        402: "`plan_limit_reached`: the rows would take the lab past its plan's stored readings; nothing was saved (Retry-After 3600 s).",
      },
      handle: async ({ lab, actor, body }): Promise<ResubmitOutcome> => presentResubmitOutcome(await quarantine.resubmit(lab, actor, body.rows), body.rows),
    }),
    defineRoute({
      method: 'post',
      path: '/quarantine/bulk/preview',
      auth: { permission: 'quarantine.review' },
      summary:
        'What a bulk repair (re-read times, shift times, map to a channel, discard) would do with the selected rows — every row matching a filter of the list, or rows by id: how many would be stored, stay quarantined (by new reason) or be discarded, with the first rows before → after. Nothing is changed.',
      body: bulkRequestSchema,
      response: { status: 200, description: 'The counts (selected = stored + alreadyStored + stillQuarantined + discarded), the reasons and a sample.' },
      errors: {
        402: '`plan_limit_reached`: the readings the repair would store take the lab past its plan.',
        409: '`bulk_run_active`: a bulk repair is still working in this lab.',
      },
      handle: async ({ lab, actor, body }): Promise<BulkPreview> => quarantine.bulk.preview(lab, actor, body),
    }),
    defineRoute({
      method: 'post',
      path: '/quarantine/bulk/runs',
      auth: { permission: 'quarantine.review' },
      summary:
        'Starts a bulk repair: it works in the background in one transaction (every row ends stored, still quarantined with its new reason, or discarded — or, on a failure, every row stays where it was) and is recorded in the audit log. Follow it with GET …/quarantine/bulk/runs/:runId.',
      body: bulkRequestSchema,
      response: { status: 202, description: 'The run, started (state running, done 0 of total).' },
      errors: { 409: '`bulk_run_active`: a bulk repair is still working in this lab; wait for it to end.' },
      handle: async ({ lab, actor, body }): Promise<BulkRun> => (await quarantine.bulk.start(lab, actor, body)).run,
    }),
    defineRoute({
      method: 'get',
      path: '/quarantine/bulk/runs',
      auth: { permission: 'quarantine.review' },
      summary: "The lab's ten most recent bulk repairs, newest first.",
      response: { status: 200, description: 'The runs with their progress and outcome.' },
      handle: async ({ lab }): Promise<BulkRunList> => ({ runs: await quarantine.bulk.recent(lab) }),
    }),
    defineRoute({
      method: 'get',
      path: '/quarantine/bulk/runs/:runId',
      auth: { permission: 'quarantine.review' },
      summary:
        'One bulk repair: its progress (done of total) while running, its counts once done, or why it failed (nothing applied). A run whose server stopped is marked failed once it has given no sign of life for two minutes.',
      params: bulkRunParamsSchema,
      response: { status: 200, description: 'The run.' },
      handle: async ({ lab, params }): Promise<BulkRun> => quarantine.bulk.get(lab, params.runId),
    }),
  ];
}
