import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { auditRepo, type AuditEntry } from '../db/audit.repo.ts';
import type { LabContext } from './lab-context.ts';
import type { AuditQuery } from '../contract/audit.ts';

/** Reading a lab's audit log (writing happens inside each use case's own transaction). */
export function createAuditService(deps: { db: Db }) {
  return {
    async query(lab: LabContext, q: AuditQuery): Promise<{ entries: AuditEntry[]; total: number; page: number; pageSize: number }> {
      const result = await auditRepo(inLab(deps.db, lab.id)).query({
        action: q.action,
        actor: q.actor,
        from: q.from ? new Date(q.from) : undefined,
        to: q.to ? new Date(q.to) : undefined,
        page: q.page,
        pageSize: q.pageSize,
      });
      return { ...result, page: q.page, pageSize: q.pageSize };
    },
  };
}

export type AuditService = ReturnType<typeof createAuditService>;
