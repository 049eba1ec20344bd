import type { Account, ClientMetadata, Configuration, ProviderContext } from 'oidc-provider';
import { findDevAccountBySub } from './account-lookup.ts';
import type { DevAccount } from '../../tenants/demo/people.ts';
import { IDENTITY_PROVIDER_PATHS } from './identity-provider-paths.ts';
import { escapeHtml, renderNoticePage } from './interaction-pages.ts';
import type { SigningJwk } from './signing-key.ts';

/** A relying party registered with the stand-in (a confidential client). */
export interface StandInClient {
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
  postLogoutRedirectUris?: string[];
}

/** What the stand-in's oidc-provider configuration is built from. */
export interface ProviderConfigurationInput {
  clients: readonly StandInClient[];
  accounts: readonly DevAccount[];
  cookieKeys: string[];
  signingKey: SigningJwk;
}

const MINUTE = 60;
const HOUR = 60 * MINUTE;

function toClientMetadata(client: StandInClient): ClientMetadata {
  return {
    client_id: client.clientId,
    client_secret: client.clientSecret,
    redirect_uris: client.redirectUris,
    post_logout_redirect_uris: client.postLogoutRedirectUris ?? [],
    grant_types: ['authorization_code'],
    response_types: ['code'],
    // oidc-provider treats client_secret_basic and client_secret_post as interchangeable.
    token_endpoint_auth_method: 'client_secret_basic',
  };
}

function toAccount(account: DevAccount): Account {
  return {
    accountId: account.sub,
    // The provider keeps only the claims the granted scopes allow (OpenID Connect Core 1.0 §5.4).
    claims: () => ({ sub: account.sub, email: account.email, email_verified: true, name: account.name }),
  };
}

function renderHtml(ctx: ProviderContext, html: string): void {
  ctx.type = 'html';
  ctx.body = html;
}

/**
 * Builds the oidc-provider configuration of the stand-in: authorization-code flow only for
 * confidential clients, scopes `openid email profile`, our own interaction pages (the
 * built-in development pages accept any password, so they are off), default endpoint paths,
 * distinct cookie names so they never collide with the app's cookies on 127.0.0.1, and our
 * own error and sign-out pages.
 */
export function buildProviderConfiguration(input: ProviderConfigurationInput): Configuration {
  const { accounts } = input;
  return {
    clients: input.clients.map(toClientMetadata),
    findAccount: (_ctx, sub) => {
      const account = findDevAccountBySub(accounts, sub);
      return account ? toAccount(account) : undefined;
    },
    scopes: ['openid', 'email', 'profile'],
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'] },
    responseTypes: ['code'],
    clientAuthMethods: ['client_secret_basic', 'client_secret_post'],
    jwks: { keys: [input.signingKey] },
    cookies: {
      keys: input.cookieKeys,
      names: { session: 'standin_idp_session', interaction: 'standin_idp_step', resume: 'standin_idp_resume' },
    },
    routes: {
      authorization: IDENTITY_PROVIDER_PATHS.authorization,
      token: IDENTITY_PROVIDER_PATHS.token,
      userinfo: IDENTITY_PROVIDER_PATHS.userinfo,
      jwks: IDENTITY_PROVIDER_PATHS.jwks,
      end_session: IDENTITY_PROVIDER_PATHS.endSession,
    },
    interactions: { url: (_ctx, interaction) => `${IDENTITY_PROVIDER_PATHS.interaction}/${interaction.uid}` },
    features: {
      devInteractions: { enabled: false },
      rpInitiatedLogout: {
        enabled: true,
        logoutSource: (ctx: ProviderContext, form: string) =>
          renderHtml(
            ctx,
            renderNoticePage(
              'Sign out of the stand-in?',
              ['This ends your session at the local identity provider stand-in.'],
              `${form}<div class="actions"><button class="go" type="submit" form="op.logoutForm" name="logout" value="yes">Sign out</button>` +
                `<button class="stop" type="submit" form="op.logoutForm">Stay signed in</button></div>`,
            ),
          ),
        postLogoutSuccessSource: (ctx: ProviderContext) =>
          renderHtml(ctx, renderNoticePage('Signed out', ['You are signed out of the local identity provider stand-in.'])),
      },
    },
    ttl: {
      AccessToken: HOUR,
      AuthorizationCode: MINUTE,
      IdToken: HOUR,
      Interaction: 15 * MINUTE,
      Session: 12 * HOUR,
      Grant: 12 * HOUR,
    },
    renderError: (ctx, out) =>
      renderHtml(
        ctx,
        renderNoticePage(
          'The sign-in request could not be completed',
          Object.entries(out).map(([key, value]) => `${key}: ${value}`),
          `<p><small>Stand-in issuer at ${escapeHtml(ctx.host)}</small></p>`,
        ),
      ),
  };
}
