import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import { connect, type AddressInfo } from 'node:net';
import { execFile, execFileSync } from 'node:child_process';
import { promisify } from 'node:util';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readingsFromJson } from '../../../../server/services/ingest/readings-from-body.ts';
import { parseReadingTime } from '../../../../server/services/ingest/parse-reading-time.ts';
import { curlSnippet, isoWithOffset, pythonSnippet, rawHttpSnippet, microcontrollerSnippet } from './setup-snippets.ts';

/**
 * The logger set-up examples are checked by outside parsers, not by string matching alone:
 * Node's HTTP parser receives the raw request and the compiled C program's output, Debian's
 * Python 3 runs the Python example, and the server's own ingest parser reads every body.
 */
const CHANNELS = [
  { key: 'soil_t.10cm', validMin: -20, validMax: 40 },
  { key: 'vwc-10', validMin: 0, validMax: 60 },
];
// A key in the documented shape lbk_<12 hex>_<43 chars>; invented for the test.
const KEY = 'lbk_0123456789ab_AbCdEfGhIjKlMnOpQrStUvWxYz0123456789-_AbCdEf';
const AT = Date.UTC(2026, 6, 14, 9, 30, 5); // 2026-07-14T09:30:05Z

interface Captured {
  method: string;
  url: string;
  headers: IncomingHttpHeaders;
  body: string;
}
let server: Server;
let origin: string;
const seen: Captured[] = [];
beforeAll(async () => {
  server = createServer((req, res) => {
    let body = '';
    req.setEncoding('utf8');
    req.on('data', (c: string) => (body += c));
    req.on('end', () => {
      seen.push({ method: req.method!, url: req.url!, headers: req.headers, body });
      res.writeHead(200, { 'Content-Type': 'application/json', Connection: 'close' }).end('{"accepted":2,"duplicates":0,"quarantined":[]}');
    });
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((r) => server.close(() => r())));

/** Sends `bytes` over a plain socket to the capture server and returns what Node's HTTP parser made of it. */
async function sendRaw(bytes: string): Promise<Captured> {
  const before = seen.length;
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((resolve, reject) => {
    const socket = connect(port, '127.0.0.1', () => socket.end(bytes));
    socket.on('data', () => undefined);
    socket.on('close', () => resolve());
    socket.on('error', reject);
  });
  expect(seen.length).toBe(before + 1);
  return seen[seen.length - 1];
}

/** The body's readings as the server's ingest parser reads them, with times resolved to epoch ms. */
function serverReadings(body: string) {
  return readingsFromJson(JSON.parse(body)).map((r) => ({ channel: r.channel, value: r.value, ts: parseReadingTime(r.ts) }));
}

describe('isoWithOffset', () => {
  it('writes the wall time of the zone with its offset, which reads back as the same instant', () => {
    // Central European Summer Time is UTC+2 in July, US Eastern Standard Time UTC−5 in January (IANA tz database).
    expect(isoWithOffset(AT, 'Europe/Berlin')).toBe('2026-07-14T11:30:05+02:00');
    expect(isoWithOffset(Date.UTC(2026, 0, 10, 3, 0, 0), 'America/New_York')).toBe('2026-01-09T22:00:00-05:00');
    expect(isoWithOffset(AT, 'UTC')).toBe('2026-07-14T09:30:05+00:00');
    expect(parseReadingTime(isoWithOffset(AT, 'Asia/Kolkata'))).toEqual({ ok: true, ts: AT });
  });
});

describe('set-up examples', () => {
  it('curl: uses the placeholder key, posts to the ingest endpoint, and its body holds every channel at the instant', () => {
    const text = curlSnippet('http://127.0.0.1:5310', CHANNELS, AT, 'Europe/Berlin');
    expect(text.split('\n')[0]).toBe(`curl -sS -X POST 'http://127.0.0.1:5310/api/v1/ingest' \\`);
    expect(text).toContain('-H "Authorization: Bearer $LAGBOOK_INGEST_KEY"');
    const body = /-d '([^']*)'/.exec(text)![1];
    expect(serverReadings(body)).toEqual([
      { channel: 'soil_t.10cm', value: 10, ts: { ok: true, ts: AT } },
      { channel: 'vwc-10', value: 30, ts: { ok: true, ts: AT } },
    ]);
  });

  it('raw HTTP/1.1: with CRLF line ends and a real key, Node’s HTTP parser reads the whole body at the stated length', async () => {
    const text = rawHttpSnippet(origin, CHANNELS, AT, 'UTC');
    const got = await sendRaw(text.replace('$LAGBOOK_INGEST_KEY', KEY).replace(/\n/g, '\r\n'));
    expect(got.method).toBe('POST');
    expect(got.url).toBe('/api/v1/ingest');
    expect(got.headers.authorization).toBe(`Bearer ${KEY}`);
    expect(got.headers['content-type']).toBe('application/json');
    expect(Number(got.headers['content-length'])).toBe(Buffer.byteLength(got.body));
    expect(serverReadings(got.body).map((r) => [r.channel, r.ts])).toEqual([
      ['soil_t.10cm', { ok: true, ts: AT }],
      ['vwc-10', { ok: true, ts: AT }],
    ]);
  });

  it('C program for a microcontroller logger: compiles with gcc, and the request it writes is valid HTTP/1.1 with epoch-ms readings', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lagbook-mcu-'));
    const harness = [
      microcontrollerSnippet(origin, CHANNELS).replace('$LAGBOOK_INGEST_KEY', KEY),
      '#include <string.h>',
      'int net_connect(const char *host, int port) { return 1; }',
      'void net_write(const char *data, int len) { fwrite(data, 1, len, stdout); }',
      'int net_read_line(char *line, int size) { strncpy(line, "HTTP/1.1 200 OK", size); return 1; }',
      'void net_close(void) {}',
      'int main(void) { const float v[N_CHANNELS] = { 12.5f, 31.25f }; int s = send_readings(1784021405000ULL, v); fprintf(stderr, "%d", s); return s == 200 ? 0 : 1; }',
    ].join('\n');
    writeFileSync(join(dir, 'logger.c'), harness);
    execFileSync('gcc', ['-std=c99', '-Wall', '-Werror', '-Wno-unused-parameter', '-o', join(dir, 'logger'), join(dir, 'logger.c')]);
    const written = execFileSync(join(dir, 'logger'), { stdio: ['ignore', 'pipe', 'pipe'] }).toString('latin1');
    const got = await sendRaw(written);
    expect(got.headers.authorization).toBe(`Bearer ${KEY}`);
    expect(got.headers.host).toBe(new URL(origin).host);
    // 1784021405000 ms is 2026-07-14T09:30:05Z (AT above).
    expect(serverReadings(got.body)).toEqual([
      { channel: 'soil_t.10cm', value: 12.5, ts: { ok: true, ts: AT } },
      { channel: 'vwc-10', value: 31.25, ts: { ok: true, ts: AT } },
    ]);
  });

  it('Python: runs under Debian’s python3 with the key from the environment and posts every channel stamped now', async () => {
    const before = seen.length;
    const started = Date.now();
    // asynchronously: the capture server answers on this same event loop
    const { stdout: out } = await promisify(execFile)('/usr/bin/python3', ['-c', pythonSnippet(origin, CHANNELS)], {
      env: { LAGBOOK_INGEST_KEY: KEY, PATH: process.env.PATH ?? '' },
    });
    expect(out).toContain("'accepted': 2");
    expect(seen.length).toBe(before + 1);
    const got = seen[seen.length - 1];
    expect(got.url).toBe('/api/v1/ingest');
    expect(got.headers.authorization).toBe(`Bearer ${KEY}`);
    const readings = serverReadings(got.body);
    expect(readings.map((r) => [r.channel, r.value])).toEqual([
      ['soil_t.10cm', 10],
      ['vwc-10', 30],
    ]);
    for (const r of readings) {
      expect(r.ts.ok).toBe(true);
      // whole seconds, so up to one second before the start of the run
      if (r.ts.ok) expect(Math.abs(r.ts.ts - started)).toBeLessThan(5000);
    }
    expect(JSON.parse(got.body).readings[0].ts).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\+00:00$/);
  });
});
