import { auditQuerySchema, type AuditPage } from '../../contract/audit.ts';
import { presentAuditEntry } from '../presenters/labs.presenter.ts';
import type { AuditService } from '../../services/audit.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** `GET /api/v1/labs/:lab/audit`: the audit log for admins, paged and filtered. */
export function auditRoutes(deps: { audit: AuditService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/audit',
      auth: { permission: 'audit.read' },
      summary: 'The audit log, filtered and paged.',
      query: auditQuerySchema,
      response: { status: 200, description: 'One page of entries, newest first, with the total for the filters.' },
      handle: async ({ lab, query }): Promise<AuditPage> => {
        const page = await deps.audit.query(lab, query);
        return { ...page, entries: page.entries.map(presentAuditEntry) };
      },
    }),
  ];
}
