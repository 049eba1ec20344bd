// oidc-provider 9 ships no type declarations; this covers only what the stand-in uses.
declare module 'oidc-provider' {
  import type { IncomingMessage, ServerResponse } from 'node:http';

  /** The slice of oidc-provider's Koa context the stand-in's page renderers touch. */
  export interface ProviderContext {
    status: number;
    type: string;
    body: unknown;
    host: string;
    oidc: { client?: { clientId: string; clientName?: string } };
  }

  export interface AccountClaims {
    sub: string;
    [claim: string]: unknown;
  }

  export interface Account {
    accountId: string;
    claims(use: string, scope: string): Promise<AccountClaims> | AccountClaims;
  }

  export interface InteractionPrompt {
    name: string;
    reasons: string[];
    details: {
      missingOIDCScope?: string[];
      missingOIDCClaims?: string[];
      [detail: string]: unknown;
    };
  }

  export interface Interaction {
    uid: string;
    prompt: InteractionPrompt;
    params: Record<string, unknown> & { client_id: string; scope?: string };
    session?: { accountId: string; uid: string };
    grantId?: string;
    lastSubmission?: Record<string, unknown>;
  }

  export interface InteractionResults {
    login?: { accountId: string };
    consent?: { grantId?: string };
    error?: string;
    error_description?: string;
  }

  export class Grant {
    constructor(properties: { accountId: string; clientId: string });
    addOIDCScope(scope: string): void;
    addOIDCClaims(claims: string[]): void;
    save(): Promise<string>;
  }

  export interface ClientMetadata {
    client_id: string;
    client_secret: string;
    redirect_uris: string[];
    post_logout_redirect_uris?: string[];
    grant_types?: string[];
    response_types?: string[];
    token_endpoint_auth_method?: string;
    [metadata: string]: unknown;
  }

  export interface Configuration {
    clients?: ClientMetadata[];
    findAccount?: (ctx: ProviderContext, sub: string) => Promise<Account | undefined> | Account | undefined;
    claims?: Record<string, string[] | null>;
    scopes?: string[];
    responseTypes?: string[];
    clientAuthMethods?: string[];
    features?: Record<string, unknown>;
    jwks?: { keys: object[] };
    cookies?: {
      keys?: string[];
      names?: { session?: string; interaction?: string; resume?: string };
    };
    interactions?: { url?: (ctx: ProviderContext, interaction: Interaction) => Promise<string> | string };
    routes?: Record<string, string>;
    ttl?: Record<string, number>;
    renderError?: (ctx: ProviderContext, out: Record<string, string>, error: Error) => Promise<void> | void;
    [option: string]: unknown;
  }

  export class Provider {
    constructor(issuer: string, configuration?: Configuration);
    readonly issuer: string;
    readonly Grant: {
      new (properties: { accountId: string; clientId: string }): Grant;
      find(id: string): Promise<Grant | undefined>;
    };
    callback(): (req: IncomingMessage, res: ServerResponse) => void;
    interactionDetails(req: IncomingMessage, res: ServerResponse): Promise<Interaction>;
    interactionFinished(req: IncomingMessage, res: ServerResponse, result: InteractionResults, options?: { mergeWithLastSubmission?: boolean }): Promise<void>;
  }

  export const errors: {
    SessionNotFound: new (description?: string) => Error;
  };

  export default Provider;
}
