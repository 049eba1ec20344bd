import { z } from 'zod';

/** How a route outside the lab table is reached (lab routes are described by their permission). */
export type PublicRouteAuth = 'none' | 'session' | 'ingest-key';

/** A route outside the lab route table, documented in the API document. */
export interface PublicRoute {
  method: 'get' | 'post' | 'patch';
  /** Express-style path, e.g. `/api/v1/invitations/:lab/:token`. */
  path: string;
  summary: string;
  auth: PublicRouteAuth;
  /** Request bodies by media type (the zod schema the route validates with, where it has one). */
  bodies?: Record<string, z.ZodType>;
  /** Answers beyond the usual ones, by status (a 4XX/5XX one carries the error body). */
  responses?: Record<string, string>;
}

/**
 * The shape `POST /api/v1/ingest` reads from a JSON body (`readingsFromJson`). That function
 * takes the envelope apart by hand so one bad row is quarantined rather than refusing the batch;
 * this schema documents the shape a well-formed batch has.
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

/** An uploaded or posted CSV file, documented as text (its header is described in the summary). */
const csvText = z.string().describe('CSV text with the header channel,ts,value');

/**
 * Every route outside the lab route table that the API serves, for the API document.
 * The OpenAPI test walks the app's router and fails when a route is missing here.
 */
export const PUBLIC_ROUTES: PublicRoute[] = [
  {
    method: 'post',
    path: '/api/v1/ingest',
    summary: "A logger posts readings with its ingest key, as JSON or as CSV (header channel,ts,value); 200 means committed, bad rows are quarantined with reasons.",
    auth: 'ingest-key',
    bodies: { 'application/json': ingestJsonBody, 'text/csv': csvText },
    responses: {
      '400': '`invalid_input`: not valid JSON or CSV, the wrong shape, a CSV header without channel, ts and value, or JSON nested deeper than 32 levels; `corrupt_body`: a gzip or deflate body that does not decompress.',
      '401': '`invalid_ingest_key`: a missing, unknown or revoked key (one answer for all).',
      '402': "`plan_limit_reached`: the batch would take the lab past its plan's stored readings, or its quarantine past the plan's quarantined-rows cap (`quarantinedRows` in the plan catalog). Nothing of the batch is stored, its good readings included. Retry-After (3600 s); the same batch succeeds once an admin raises the plan or, for the quarantine, a technician discards or re-submits quarantined rows.",
      '413': '`too_many_readings`: more than 100,000 readings in one request (send the rest in further requests); `payload_too_large`: a body over 8 MB after decompression.',
      '415': '`unsupported_media_type` (send application/json or text/csv), `unsupported_charset` (only UTF-8) or `unsupported_encoding` (Content-Encoding other than gzip or deflate).',
      '422': '`too_many_quarantined`: more than 1,000 rows of the batch would go to quarantine (a field missing, the wrong number of CSV fields, not an object, an unknown channel, an unreadable time or value); nothing of the batch is stored. When the body reader caught it, `error.sample` lists the first rows with their reasons.',
      '429': '`rate_limited`: this logger posts faster than 20 requests/s (bursts of 40); `too_many_wrong_keys`: more than 20 wrong keys from this address within a minute (counted per app process; a key that worked recently still gets through). Retry-After gives the seconds to wait.',
    },
  },
];
