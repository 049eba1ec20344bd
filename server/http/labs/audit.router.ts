import { labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { auditQuerySchema } from './labs.schema.ts';
import { presentAuditEntry } from '../presenters/labs.presenter.ts';
import type { AuditService } from '../../services/audit.service.ts';
import type { LabRoute } from '../lab-routes.ts';

/** `GET /api/v1/labs/:lab/audit`: the audit log for admins, paged and filtered. */
export function auditRoutes(deps: { audit: AuditService }): LabRoute[] {
  return [
    {
      method: 'get',
      path: '/audit',
      permission: 'audit.read',
      summary: 'The audit log, filtered and paged.',
      query: auditQuerySchema,
      handle: async (req, res) => {
        const q = parseInput(auditQuerySchema, req.query);
        const page = await deps.audit.query(labOf(res), q);
        res.json({ ...page, entries: page.entries.map(presentAuditEntry) });
      },
    },
  ];
}
