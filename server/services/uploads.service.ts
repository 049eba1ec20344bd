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
import type { LabContext } from './lab-context.ts';

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

    /** How the file will be read; a custom time pattern that cannot be read answers 400 `timePattern: …` here, before the upload starts. */
    layoutOf(options: UploadOptions): UploadLayout {
      return resolveUploadLayout(options);
    },

    run(target: IngestTarget, file: Readable, layout: UploadLayout, onProgress: (p: UploadProgress) => void): Promise<UploadSummary> {
      return importUpload(deps.db, target, file, layout, onProgress, { now: deps.now, hooks: deps.hooks });
    },
  };
}

export type UploadsService = ReturnType<typeof createUploadsService>;
