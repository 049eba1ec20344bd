/** What the example needs to know about the channel it posts to. */
export interface ExampleChannel {
  key: string;
  validMin?: number | null;
  validMax?: number | null;
}

/**
 * A sample value for a channel: the middle of its valid range when both ends are set (so the
 * example reading is never quarantined as out of range), else 0.
 */
export function sampleValue(channel: ExampleChannel): number {
  const { validMin, validMax } = channel;
  if (typeof validMin === 'number' && typeof validMax === 'number') return Number(((validMin + validMax) / 2).toPrecision(6));
  return 0;
}

/**
 * A ready-to-run `curl` command that posts one reading of `channel` at instant `at` to
 * `POST /api/v1/ingest` with `key`, in the JSON shape of the ingest API. Key and channel keys
 * contain only letters, digits, `_`, `.` and `-`, so single-quoting the body is safe.
 */
export function curlIngestExample(origin: string, key: string, channel: ExampleChannel, at: Date): string {
  const body = JSON.stringify({ readings: [{ channel: channel.key, ts: at.toISOString().replace(/\.\d{3}Z$/, 'Z'), value: sampleValue(channel) }] });
  return [
    `curl -sS -X POST '${origin}/api/v1/ingest' \\`,
    `  -H 'Authorization: Bearer ${key}' \\`,
    `  -H 'Content-Type: application/json' \\`,
    `  -d '${body}'`,
  ].join('\n');
}
