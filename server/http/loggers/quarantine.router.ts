import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { encodeQuarantineCursor, quarantineIdsSchema, quarantineQuerySchema, quarantineResubmitSchema } from './loggers.schema.ts';
import { presentQuarantinedRow } from '../presenters/loggers.presenter.ts';
import { csvLine } from '../csv-field.ts';
import type { QuarantineService } from '../../services/quarantine.service.ts';
import type { LabRoute } from '../lab-routes.ts';

const CSV_COLUMNS = ['id', 'logger_id', 'source', 'row_index', 'reason_code', 'reason', 'channel', 'ts', 'value', 'raw', 'received_at'];

/** Quarantined rows: review, export, discard, fix and re-submit (technicians and admins). */
export function quarantineRoutes(deps: { quarantine: QuarantineService }): LabRoute[] {
  const { quarantine } = deps;
  return [
    {
      method: 'get',
      path: '/quarantine',
      permission: 'quarantine.review',
      summary:
        'Quarantined rows with their reasons, newest first, in keyset pages: ask for the next page with `cursor` set to the `nextCursor` of the previous one (null on the last page). `total` counts matching rows up to 10,000 (`totalAtLeast` is true when there are at least that many).',
      query: quarantineQuerySchema,
      handle: async (req, res) => {
        const q = parseInput(quarantineQuerySchema, req.query);
        const page = await quarantine.list(labOf(res), { loggerId: q.loggerId, reasonCode: q.reason, after: q.cursor, pageSize: q.pageSize });
        res.json({
          rows: page.rows.map(presentQuarantinedRow),
          total: page.total,
          totalAtLeast: page.totalAtLeast,
          pageSize: q.pageSize,
          nextCursor: page.nextCursor ? encodeQuarantineCursor(page.nextCursor) : null,
        });
      },
    },
    {
      method: 'get',
      path: '/quarantine/export.csv',
      permission: 'quarantine.review',
      summary: 'Quarantined rows as a CSV file (every matching row; text cells that a spreadsheet would read as a formula start with an apostrophe).',
      query: quarantineQuerySchema,
      handle: async (req, res) => {
        const q = parseInput(quarantineQuerySchema, req.query);
        const lab = labOf(res);
        res.set('Content-Type', 'text/csv; charset=utf-8');
        res.set('Content-Disposition', `attachment; filename="${lab.slug}-quarantine.csv"`);
        res.write(csvLine(CSV_COLUMNS));
        for await (const rows of quarantine.all(lab, { loggerId: q.loggerId, reasonCode: q.reason })) {
          for (const r of rows) {
            res.write(csvLine([r.id, r.loggerId, r.source, r.rowIndex, r.reasonCode, r.reason, r.channelKey, r.tsRaw, r.valueRaw, r.raw, r.receivedAt.toISOString()]));
          }
        }
        res.end();
      },
    },
    {
      method: 'post',
      path: '/quarantine/discard',
      permission: 'quarantine.review',
      summary: 'Discard quarantined rows.',
      body: quarantineIdsSchema,
      handle: async (req, res) => {
        const { ids } = parseInput(quarantineIdsSchema, req.body);
        res.json({ discarded: await quarantine.discard(labOf(res), actorOf(req), ids) });
      },
    },
    {
      method: 'post',
      path: '/quarantine/resubmit',
      permission: 'quarantine.review',
      summary: 'Fix quarantined rows and send them through ingestion again.',
      body: quarantineResubmitSchema,
      handle: async (req, res) => {
        const { rows } = parseInput(quarantineResubmitSchema, req.body);
        const outcome = await quarantine.resubmit(labOf(res), actorOf(req), rows);
        res.json({
          resubmitted: outcome.resubmitted,
          accepted: outcome.accepted,
          duplicates: outcome.duplicates,
          quarantined: outcome.quarantined.map((q) => ({ id: rows[q.index].id, code: q.code, reason: q.reason })),
        });
      },
    },
  ];
}
