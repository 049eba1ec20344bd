import { z } from 'zod';

/**
 * `POST /api/v1/ingest`: what a logger sends and what it gets back, plus the answer every other
 * way in (re-submit, test reading, upload batches) reports readings with. Pure zod, shared with
 * the client.
 */

/**
 * The shape a well-formed JSON batch has. The ingest route reads the body itself (one bad row is
 * quarantined rather than refusing the batch), so this schema documents the body; it does not
 * parse it.
 */
export const ingestJsonBody = z.object({
  readings: z
    .array(
      z.object({
        channel: z.string().describe("the channel's key on this logger"),
        ts: z.union([z.number().int(), z.string()]).describe('epoch milliseconds, or ISO 8601 with a zone'),
        value: z.number().describe('a finite number'),
      }),
    )
    .max(100_000),
});

/** A posted CSV batch, documented as text (its header is channel,ts,value). */
export const ingestCsvBody = z.string().describe('CSV text with the header channel,ts,value');

/** One row that went to quarantine: its position in the request, the reason code and the reason. */
export interface QuarantinedReading {
  index: number;
  code: string;
  reason: string;
}

/**
 * `POST /api/v1/ingest` (200, after COMMIT): every row of the request is accounted for,
 * `accepted + duplicates + quarantined.length` = rows sent.
 */
export interface IngestAnswer {
  accepted: number;
  duplicates: number;
  quarantined: QuarantinedReading[];
}
