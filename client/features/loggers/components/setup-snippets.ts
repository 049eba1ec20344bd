import { zoneOffsetMinutes, formatZoned } from '../../../components/clock/format.ts';
import { sampleValue, type ExampleChannel } from './ingest-example.ts';

/**
 * Copy-ready ways for a logger to post readings to `POST /api/v1/ingest`, built from the
 * logger's real channel keys. The key is never known to the page (it is shown once, when
 * issued), so every example reads it from `$LAGBOOK_INGEST_KEY` or has it pasted in.
 * Times are ISO 8601 with a UTC offset, or UTC epoch milliseconds (both accepted by the
 * server's `parseReadingTime`).
 */

/** The placeholder every example uses for the logger's ingest key. */
export const KEY_PLACEHOLDER = '$LAGBOOK_INGEST_KEY';

/** The ingest endpoint at the server the page was loaded from. */
export function ingestEndpoint(origin: string): string {
  return `${origin.replace(/\/+$/, '')}/api/v1/ingest`;
}

/** ISO 8601 local time of `timeZone` at instant `ms`, whole seconds, with its offset: `2026-09-01T08:30:00+02:00`. */
export function isoWithOffset(ms: number, timeZone: string): string {
  const minutes = zoneOffsetMinutes(ms, timeZone);
  const m = Math.abs(minutes);
  const offset = `${minutes < 0 ? '-' : '+'}${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
  return `${formatZoned(ms, timeZone, { seconds: true }).replace(' ', 'T')}${offset}`;
}

/** The JSON body of the ingest API: one reading per channel, all at `ts`. */
export function readingsBody(channels: ExampleChannel[], ts: string | number): string {
  return JSON.stringify({ readings: channels.map((c) => ({ channel: c.key, ts, value: sampleValue(c) })) });
}

/**
 * `curl` posting one reading per channel at `at` (in the logger's zone, with offset). The key
 * header is double-quoted so a POSIX shell fills in `$LAGBOOK_INGEST_KEY`; the body is
 * single-quoted (channel keys hold only letters, digits, `_`, `.` and `-`).
 */
export function curlSnippet(origin: string, channels: ExampleChannel[], at: number, timeZone: string): string {
  return [
    `curl -sS -X POST '${ingestEndpoint(origin)}' \\`,
    `  -H "Authorization: Bearer ${KEY_PLACEHOLDER}" \\`,
    `  -H 'Content-Type: application/json' \\`,
    `  -d '${readingsBody(channels, isoWithOffset(at, timeZone))}'`,
  ].join('\n');
}

/** Python 3, standard library only (urllib): a `send(values)` that stamps readings now, in UTC with offset. */
export function pythonSnippet(origin: string, channels: ExampleChannel[]): string {
  const values = channels.map((c) => `${JSON.stringify(c.key)}: ${sampleValue(c)}`).join(', ');
  return [
    'import json, os, time, urllib.request',
    'from datetime import datetime, timezone',
    '',
    `URL = ${JSON.stringify(ingestEndpoint(origin))}`,
    'KEY = os.environ["LAGBOOK_INGEST_KEY"]  # the key shown once when it was issued',
    '',
    'def send(values):',
    '    """Posts one reading per channel, all stamped now; returns the server\'s answer."""',
    '    ts = datetime.now(timezone.utc).isoformat(timespec="seconds")  # e.g. 2026-09-01T06:30:00+00:00',
    '    # or UTC epoch milliseconds: ts = int(time.time() * 1000)',
    '    body = {"readings": [{"channel": k, "ts": ts, "value": v} for k, v in values.items()]}',
    '    req = urllib.request.Request(URL, data=json.dumps(body).encode("utf-8"), method="POST",',
    '                                 headers={"Authorization": "Bearer " + KEY, "Content-Type": "application/json"})',
    '    with urllib.request.urlopen(req, timeout=30) as res:',
    '        return json.load(res)',
    '',
    `print(send({${values}}))  # your sensor values here`,
  ].join('\n');
}

/** Host and port of the server, as a socket client needs them. */
function hostAndPort(origin: string): { host: string; port: number; tls: boolean } {
  const url = new URL(origin);
  const tls = url.protocol === 'https:';
  return { host: url.hostname, port: url.port ? Number(url.port) : tls ? 443 : 80, tls };
}

/** UTF-8 length in bytes, as `Content-Length` counts. */
const byteLength = (text: string) => new TextEncoder().encode(text).length;

/**
 * The exact HTTP/1.1 request a small board sends (CRLF line ends when sent; shown with plain
 * line breaks), with a `Content-Length` that matches the body to the byte.
 */
export function rawHttpSnippet(origin: string, channels: ExampleChannel[], at: number, timeZone: string): string {
  const { host, port } = hostAndPort(origin);
  const body = readingsBody(channels, isoWithOffset(at, timeZone));
  return [
    'POST /api/v1/ingest HTTP/1.1',
    `Host: ${host}:${port}`,
    `Authorization: Bearer ${KEY_PLACEHOLDER}`,
    'Content-Type: application/json',
    `Content-Length: ${byteLength(body)}`,
    'Connection: close',
    '',
    body,
  ].join('\n');
}

/**
 * A minimal C program for a microcontroller logger: builds the JSON body with epoch-millisecond times
 * (from the board's NTP-set clock), writes the request above over a plain TCP client and
 * returns the HTTP status. `net_*` stand for whatever TCP client the board's toolkit offers.
 */
export function microcontrollerSnippet(origin: string, channels: ExampleChannel[]): string {
  const { host, port, tls } = hostAndPort(origin);
  const keys = channels.map((c) => JSON.stringify(c.key)).join(', ');
  const bodySize = 32 + channels.reduce((n, c) => n + c.key.length + 64, 0);
  return [
    '/* Posts readings to Lagbook with plain HTTP/1.1 over a TCP client.',
    " * net_connect / net_write / net_read_line / net_close stand for your board's TCP client." +
      (tls ? '\n * The server speaks HTTPS: open a TLS connection instead of a plain one.' : ''),
    ' */',
    '#include <stdio.h>',
    '',
    'int net_connect(const char *host, int port);',
    'void net_write(const char *data, int len);',
    'int net_read_line(char *line, int size);',
    'void net_close(void);',
    '',
    `#define LAGBOOK_HOST "${host}"`,
    `#define LAGBOOK_PORT ${port}`,
    `#define INGEST_KEY "${KEY_PLACEHOLDER}" /* paste this logger's ingest key here */`,
    `#define N_CHANNELS ${channels.length}`,
    '',
    `static const char *CHANNELS[N_CHANNELS] = { ${keys} };`,
    '',
    '/* One reading per channel at epoch_ms (UTC milliseconds since 1970, e.g. from NTP).',
    ' * Returns the HTTP status: 200 = stored; on 429 or 5xx keep the readings and retry later. */',
    'int send_readings(unsigned long long epoch_ms, const float values[N_CHANNELS]) {',
    `  char body[${bodySize}];`,
    '  int len = snprintf(body, sizeof body, "{\\"readings\\":[");',
    '  for (int i = 0; i < N_CHANNELS; i++)',
    '    len += snprintf(body + len, sizeof body - len, "%s{\\"channel\\":\\"%s\\",\\"ts\\":%llu,\\"value\\":%.3f}",',
    '                    i ? "," : "", CHANNELS[i], epoch_ms, values[i]);',
    '  len += snprintf(body + len, sizeof body - len, "]}");',
    '',
    '  char head[320];',
    '  int head_len = snprintf(head, sizeof head,',
    '      "POST /api/v1/ingest HTTP/1.1\\r\\n"',
    '      "Host: %s:%d\\r\\n"',
    '      "Authorization: Bearer %s\\r\\n"',
    '      "Content-Type: application/json\\r\\n"',
    '      "Content-Length: %d\\r\\n"',
    '      "Connection: close\\r\\n\\r\\n",',
    '      LAGBOOK_HOST, LAGBOOK_PORT, INGEST_KEY, len);',
    '',
    '  if (!net_connect(LAGBOOK_HOST, LAGBOOK_PORT)) return -1;',
    '  net_write(head, head_len);',
    '  net_write(body, len);',
    '  char status_line[64] = "";',
    '  net_read_line(status_line, sizeof status_line); /* e.g. "HTTP/1.1 200 OK" */',
    '  net_close();',
    '  int status = 0;',
    '  sscanf(status_line, "HTTP/1.%*d %d", &status);',
    '  return status;',
    '}',
  ].join('\n');
}
