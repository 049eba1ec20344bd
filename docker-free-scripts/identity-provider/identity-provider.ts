import { createServer } from 'node:http';
import { randomBytes } from 'node:crypto';
import express from 'express';
import Provider from 'oidc-provider';
import { listenHttpServer } from '../shared/listen-http-server.ts';
import { DEV_ACCOUNTS, type DevAccount } from '../../tenants/demo/people.ts';
import { IDENTITY_PROVIDER_PATHS } from './identity-provider-paths.ts';
import { createInteractionRouter } from './interaction-routes.ts';
import { buildProviderConfiguration, type StandInClient } from './provider-configuration.ts';
import { generateSigningJwk } from './signing-key.ts';

export { IDENTITY_PROVIDER_PATHS };

/** Options of {@link startIdentityProvider}. */
export interface IdentityProviderOptions {
  host?: string;
  /** 0 picks a free ephemeral port; the returned object tells the real one. */
  port: number;
  clients: StandInClient[];
  accounts?: DevAccount[];
  /** Keys that sign the provider's cookies; random per start when omitted. */
  cookieKeys?: string[];
}

/** A running identity provider stand-in. */
export interface RunningIdentityProvider {
  /** `http://127.0.0.1:<port>`, no trailing slash, exactly as the ID token's `iss`. */
  issuer: string;
  port: number;
  close(): Promise<void>;
}

/**
 * Starts a local OpenID Connect provider (oidc-provider 9) that stands in for a lab's
 * institutional sign-in during development and tests: authorization-code flow with optional
 * PKCE S256 (RFC 7636), the dev accounts as users, our own login and consent pages. It binds
 * 127.0.0.1 unless told otherwise and must never be exposed beyond the developer's machine.
 */
export async function startIdentityProvider(opts: IdentityProviderOptions): Promise<RunningIdentityProvider> {
  const host = opts.host ?? '127.0.0.1';
  const accounts = opts.accounts ?? DEV_ACCOUNTS;
  const server = createServer();
  // The issuer must contain the real port, so bind first and attach the app afterwards.
  const listening = await listenHttpServer(server, opts.port, host);
  const issuer = listening.url;

  const provider = new Provider(
    issuer,
    buildProviderConfiguration({
      clients: opts.clients,
      accounts,
      cookieKeys: opts.cookieKeys ?? [randomBytes(32).toString('base64url')],
      signingKey: generateSigningJwk(),
    }),
  );
  const app = express();
  app.disable('x-powered-by');
  app.use(IDENTITY_PROVIDER_PATHS.interaction, createInteractionRouter(provider, accounts));
  app.use(provider.callback());
  server.on('request', app);

  return { issuer, port: listening.port, close: listening.close };
}
