import { once } from 'node:events';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';

/** An HTTP server bound to its port, with the URL clients should use and a way to stop it. */
export interface ListeningHttpServer {
  port: number;
  /** `http://<host>:<port>` with no trailing slash; IPv6 hosts in brackets. */
  url: string;
  close(): Promise<void>;
}

/** The base URL of a server listening on `host` and `port`. */
export function httpUrlOf(host: string, port: number): string {
  return `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
}

/**
 * Binds `server` (port 0 picks a free one) and resolves once it listens, rejecting with the
 * listen error (e.g. EADDRINUSE). Shared by the three local stand-ins; `close` also drops
 * idle keep-alive connections so tests and `npm start` shut down at once.
 */
export async function listenHttpServer(server: Server, port: number, host: string): Promise<ListeningHttpServer> {
  server.listen(port, host);
  await once(server, 'listening');
  const bound = (server.address() as AddressInfo).port;
  return {
    port: bound,
    url: httpUrlOf(host, bound),
    close: async () => {
      if (!server.listening) return;
      const closed = once(server, 'close');
      server.close();
      server.closeAllConnections();
      await closed;
    },
  };
}
