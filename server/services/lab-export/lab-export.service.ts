import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { membershipsRepo } from '../../db/memberships.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import { channelsRepo, type Channel } from '../../db/channels.repo.ts';
import { alertRulesRepo } from '../../db/alert-rules.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { labsRepo } from '../../db/labs.repo.ts';
import { NotFoundError } from '../../errors.ts';
import { LAB_EXPORT_FORMAT, type LabExportSettings } from '../../contract/labs.ts';
import type { ChannelsService } from '../channels.service.ts';
import type { Actor, LabContext } from '../lab-context.ts';

/** Earliest and latest instants a JavaScript Date can hold (ECMA-262 §21.4.1.1): "all of a channel's readings". */
const ALL_TIME = { from: -8.64e15, to: 8.64e15 };

/** One channel of a full export with the path of its readings file inside the archive. */
export interface ExportedChannel {
  channel: Channel;
  /** `readings/logger-<loggerId>/<channel key>.csv` (ids and keys only: safe in every file system). */
  file: string;
}

/** A full export's plan: the settings for `lab.json` and the channels whose readings follow, one file each. */
export interface LabExportPlan {
  settings: LabExportSettings;
  channels: ExportedChannel[];
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

/**
 * A lab's full export (admins, `lab.manage`; offered before deletion, usable any time): the
 * settings as one JSON document — the lab, members with roles, loggers, channels with their
 * settings (retired ones too), alert rules and, when the notes service is given, every note —
 * and every channel's readings, read page by page through the channel service (never the whole
 * lab in memory). The http layer writes them into one streamed zip. `notes` is the notes
 * service's lab-wide list; without it the export leaves notes out.
 */
export function createLabExportService(deps: {
  db: Db;
  channels: Pick<ChannelsService, 'readingPages'>;
  notes?: { allNotesOfLab(lab: Pick<LabContext, 'id'>): Promise<unknown[]> };
  now?: () => Date;
}) {
  const now = deps.now ?? (() => new Date());

  return {
    /** What the export will hold (settings read now; readings streamed afterwards with `readingPages`). */
    async plan(lab: LabContext): Promise<LabExportPlan> {
      const scope = inLab(deps.db, lab.id);
      const current = await labsRepo(deps.db).findById(lab.id);
      if (!current) throw new NotFoundError('No lab at this address, or you are not a member of it.');
      const [members, loggers, rules] = await Promise.all([
        membershipsRepo(scope).list(),
        loggersRepo(scope).list({ includeRetired: true }),
        alertRulesRepo(scope).list(),
      ]);
      const channels: ExportedChannel[] = [];
      for (const logger of loggers) {
        for (const channel of await channelsRepo(scope).listForLogger(logger.id, { includeRetired: true })) {
          channels.push({ channel, file: `readings/logger-${logger.id}/${channel.key}.csv` });
        }
      }
      const settings: LabExportSettings = {
        format: LAB_EXPORT_FORMAT,
        exportedAt: now().toISOString(),
        lab: { slug: current.slug, name: current.name, description: current.description, createdAt: current.createdAt.toISOString() },
        members: members.map((m) => ({ name: m.name, email: m.email, role: m.role, joinedAt: m.joinedAt.toISOString() })),
        loggers: loggers.map((l) => ({
          ...l,
          createdAt: l.createdAt.toISOString(),
          retiredAt: iso(l.retiredAt),
          lastSeenAt: l.lastSeenAt === null ? null : new Date(l.lastSeenAt).toISOString(),
        })),
        channels: channels.map(({ channel, file }) => ({ ...channel, retiredAt: iso(channel.retiredAt), readingsFile: file })),
        alertRules: rules.map((r) => ({
          id: r.id,
          name: r.name,
          kind: r.kind,
          channelId: r.channelId,
          loggerId: r.loggerId,
          params: r.params,
          reminderAfterMin: r.reminderAfterMin,
          enabled: r.enabled,
          createdAt: r.createdAt.toISOString(),
          updatedAt: r.updatedAt.toISOString(),
        })),
        ...(deps.notes ? { notes: (await deps.notes.allNotesOfLab(lab)) as Array<Record<string, unknown>> } : {}),
      };
      return { settings, channels };
    },

    /** Every reading of one channel, oldest first, a page at a time. */
    readingPages(lab: LabContext, channelId: number): AsyncGenerator<{ ts: Float64Array; values: Float64Array }> {
      return deps.channels.readingPages(lab, channelId, ALL_TIME);
    },

    /** Records in the lab's audit log that `actor` downloaded a full export. */
    async recordExport(lab: LabContext, actor: Actor, plan: LabExportPlan): Promise<void> {
      await auditRepo(inLab(deps.db, lab.id)).record({
        actorUserId: actor.id,
        action: 'lab.exported',
        targetType: 'lab',
        targetId: lab.slug,
        summary: `${actor.displayName} downloaded a full export of the lab (${plan.channels.length} channel readings files)`,
        details: { channels: plan.channels.length, loggers: plan.settings.loggers.length, notes: plan.settings.notes?.length ?? null },
      });
    },
  };
}

export type LabExportService = ReturnType<typeof createLabExportService>;
