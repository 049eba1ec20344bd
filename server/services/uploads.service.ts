import type { Readable } from 'node:stream';
import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { loggersRepo } from '../db/loggers.repo.ts';
import { NotFoundError } from '../errors.ts';
import { ConflictError } from './service-errors.ts';
import { importUpload, resolveUploadLayout, type UploadLayout, type UploadProgress, type UploadSummary } from './ingest/import-upload.ts';
import type { TimePreviewAnswer, TimePreviewInput, UploadOptions } from '../contract/uploads.ts';
import { previewUploadTimes } from './ingest/time-preview.ts';
import type { IngestHooks } from './ingest/ingest-hooks.ts';
import type { IngestTarget } from './ingest/ingest-batch.ts';
import type { Actor, LabContext } from './lab-context.ts';
import { auditRepo } from '../db/audit.repo.ts';

/**
 * Historical uploads: which logger a file goes to (checked before the answer starts
 * streaming), then the streamed import itself under the same rules as live ingestion.
 */
export function createUploadsService(deps: { db: Db; now?: () => number; hooks?: IngestHooks }) {
  return {
    /** The ingest target for a logger of this lab that can still take history. */
    async targetFor(lab: LabContext, loggerId: number): Promise<IngestTarget> {
      const logger = await loggersRepo(inLab(deps.db, lab.id)).find(loggerId);
      if (!logger) throw new NotFoundError('No such logger in this lab.');
      if (logger.retiredAt) throw new ConflictError('logger_retired', 'This logger is retired; its history cannot be extended.');
      return { tenantId: lab.id, loggerId };
    },

    /** How an upload's first time texts will be read and stored (for the form's preview). */
    previewTimes(input: TimePreviewInput): TimePreviewAnswer {
      return previewUploadTimes(input);
    },

    /** How the file will be read; a custom time pattern that cannot be read answers 400 `Pattern of the times: …` here, before the upload starts. */
    layoutOf(options: UploadOptions): UploadLayout {
      return resolveUploadLayout(options);
    },

    /**
     * Imports the file and records the upload in the lab's audit log (`logger.uploaded`, with its
     * counts) — also when it stops partway, with what was stored — so the lab's overview can say
     * when history last came in and who sent it.
     */
    async run(
      target: IngestTarget,
      file: Readable,
      layout: UploadLayout,
      onProgress: (p: UploadProgress) => void,
      by: Actor | null = null,
    ): Promise<UploadSummary> {
      let progress: UploadProgress = { lines: 0, readings: 0, accepted: 0, duplicates: 0, quarantined: 0 };
      const record = (p: UploadProgress, stopped: boolean) =>
        auditRepo(inLab(deps.db, target.tenantId)).record({
          actorUserId: by?.id ?? null,
          action: 'logger.uploaded',
          targetType: 'logger',
          targetId: target.loggerId,
          summary: `${by?.displayName ?? 'Someone'} uploaded a history file: ${p.accepted} readings stored, ${p.quarantined} quarantined${stopped ? ' (stopped early)' : ''}`,
          details: { lines: p.lines, readings: p.readings, accepted: p.accepted, duplicates: p.duplicates, quarantined: p.quarantined, stopped },
        });
      try {
        const summary = await importUpload(deps.db, target, file, layout, (p) => onProgress((progress = p)), { now: deps.now, hooks: deps.hooks });
        await record(summary, false);
        return summary;
      } catch (err) {
        if (progress.lines > 0) await record(progress, true).catch(() => undefined);
        throw err;
      }
    },
  };
}

export type UploadsService = ReturnType<typeof createUploadsService>;
