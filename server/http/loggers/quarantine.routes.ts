import {
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
        presentQuarantinePage(
          await quarantine.list(lab, { loggerId: query.loggerId, reasonCode: query.reason, after: query.cursor, pageSize: query.pageSize }),
          query.pageSize,
        ),
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
        for await (const rows of quarantine.all(lab, { loggerId: query.loggerId, reasonCode: query.reason })) {
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
  ];
}
