import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

export interface AuditEventInput {
  actorUserId: number | null;
  action: string;
  targetType?: string;
  targetId?: string | number;
  summary: string;
  details?: Record<string, unknown>;
}

export interface AuditEntry {
  id: number;
  at: Date;
  actor: { name: string; email: string } | null;
  action: string;
  summary: string;
  details: Record<string, unknown> | null;
}

export interface AuditFilter {
  action?: string;
  actor?: string;
  from?: Date;
  to?: Date;
  page: number;
  pageSize: number;
}

/** Data access for one lab's append-only `audit_events`. */
export function auditRepo(scope: LabScope) {
  return {
    async record(event: AuditEventInput): Promise<void> {
      await scope.insert('audit_events', {
        id: newId(),
        actor_user_id: event.actorUserId,
        action: event.action,
        target_type: event.targetType ?? null,
        target_id: event.targetId === undefined ? null : String(event.targetId),
        summary: event.summary.slice(0, 255),
        details: event.details ? JSON.stringify(event.details) : null,
      });
    },

    /** One page of entries, newest first, and the total that match the filter. */
    async query(filter: AuditFilter): Promise<{ entries: AuditEntry[]; total: number }> {
      const filtered = () => {
        const q = scope.table('audit_events').leftJoin('users as actor', 'actor.id', 'audit_events.actor_user_id');
        if (filter.action) q.where('audit_events.action', filter.action);
        if (filter.from) q.where('audit_events.at', '>=', filter.from);
        if (filter.to) q.where('audit_events.at', '<=', filter.to);
        if (filter.actor) {
          const like = `%${filter.actor.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
          q.where((w) => w.where('actor.display_name', 'like', like).orWhere('actor.email', 'like', like));
        }
        return q;
      };
      const [{ n }] = await filtered().count({ n: '*' });
      const rows = await filtered()
        .orderBy([
          { column: 'audit_events.at', order: 'desc' },
          { column: 'audit_events.id', order: 'desc' },
        ])
        .limit(filter.pageSize)
        .offset((filter.page - 1) * filter.pageSize)
        .select(
          'audit_events.id',
          'audit_events.at',
          'audit_events.action',
          'audit_events.summary',
          'audit_events.details',
          'actor.display_name as actorName',
          'actor.email as actorEmail',
        );
      return {
        total: Number(n),
        entries: rows.map((r: Record<string, unknown>) => ({
          id: Number(r.id),
          at: r.at as Date,
          actor: r.actorEmail ? { name: r.actorName as string, email: r.actorEmail as string } : null,
          action: r.action as string,
          summary: r.summary as string,
          details: typeof r.details === 'string' ? JSON.parse(r.details) : ((r.details as Record<string, unknown> | null) ?? null),
        })),
      };
    },
  };
}

export type AuditRepo = ReturnType<typeof auditRepo>;
