import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { listenHttpServer, type ListeningHttpServer } from '../shared/listen-http-server.ts';
import type { CapturedMail } from './mail-capture.ts';

/** What the HTTP side reads from and clears in the capture. */
export interface MailCaptureHttpOptions {
  host: string;
  port: number;
  messages(): readonly CapturedMail[];
  clear(): void;
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const payload = JSON.stringify(body);
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
  res.end(payload);
}

/** Keeps the messages delivered to `to` (compared case-insensitively), or all when no filter is given. */
export function filterByRecipient(messages: readonly CapturedMail[], to: string | null): CapturedMail[] {
  if (!to) return [...messages];
  const wanted = to.trim().toLowerCase();
  return messages.filter((mail) => mail.to.some((address) => address.toLowerCase() === wanted));
}

function route(options: MailCaptureHttpOptions, req: IncomingMessage, res: ServerResponse): void {
  const url = new URL(req.url ?? '/', 'http://capture.invalid');
  if (url.pathname === '/healthz' && req.method === 'GET') {
    sendJson(res, 200, { ok: true });
    return;
  }
  if (url.pathname !== '/messages') {
    sendJson(res, 404, { error: { code: 'not_found', message: `No route ${req.method} ${url.pathname}` } });
    return;
  }
  if (req.method === 'GET') {
    sendJson(res, 200, filterByRecipient(options.messages(), url.searchParams.get('to')));
    return;
  }
  if (req.method === 'DELETE') {
    options.clear();
    res.writeHead(204).end();
    return;
  }
  res.setHeader('allow', 'GET, DELETE');
  sendJson(res, 405, { error: { code: 'method_not_allowed', message: `${req.method} is not allowed on /messages` } });
}

/**
 * Starts the capture's HTTP side: `GET /healthz`, `GET /messages` (JSON array, oldest first,
 * optional `?to=address`) and `DELETE /messages`, so tests in other processes can read mail.
 */
export async function startMailCaptureHttp(options: MailCaptureHttpOptions): Promise<ListeningHttpServer> {
  return listenHttpServer(
    createServer((req, res) => route(options, req, res)),
    options.port,
    options.host,
  );
}
