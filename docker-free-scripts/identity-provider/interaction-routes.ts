import express, { type NextFunction, type Request, type Response, type Router } from 'express';
import type { Interaction, Provider } from 'oidc-provider';
import { errors } from 'oidc-provider';
import { findDevAccountBySub, matchDevAccount } from './account-lookup.ts';
import type { DevAccount } from '../../tenants/demo/people.ts';
import { renderConsentPage, renderLoginPage, renderNoticePage } from './interaction-pages.ts';

/** Message shown when the e-mail and password match no dev account. */
export const WRONG_CREDENTIALS_MESSAGE = 'That e-mail and password do not match a dev account.';

/** A request to an interaction page that cannot be served; carries the HTTP status to answer with. */
export class InteractionPageError extends Error {
  readonly status: number;

  constructor(status: number, message: string) {
    super(message);
    this.name = 'InteractionPageError';
    this.status = status;
  }
}

function expectPrompt(interaction: Interaction, name: 'login' | 'consent'): void {
  if (interaction.prompt.name !== name) {
    throw new InteractionPageError(400, `This sign-in request is waiting for "${interaction.prompt.name}", not "${name}".`);
  }
}

function formField(req: Request, field: string): string {
  const body: unknown = req.body;
  if (typeof body !== 'object' || body === null) return '';
  const value = (body as Record<string, unknown>)[field];
  return typeof value === 'string' ? value : '';
}

function sendHtml(res: Response, status: number, html: string): void {
  res.status(status).type('html').set('Cache-Control', 'no-store').send(html);
}

/**
 * Express routes of the stand-in's interaction pages under `/interaction/:uid`: show the
 * login or consent page for the current prompt, check a password, record consent as a
 * `Grant`, or end the request with `access_denied` (OpenID Connect Core 1.0 §3.1.2.6).
 */
export function createInteractionRouter(provider: Provider, accounts: readonly DevAccount[]): Router {
  const router = express.Router();
  const parseForm = express.urlencoded({ extended: false, limit: '4kb' });

  router.get('/:uid', async (req, res) => {
    const interaction = await provider.interactionDetails(req, res);
    const clientId = interaction.params.client_id;
    if (interaction.prompt.name === 'login') {
      sendHtml(res, 200, renderLoginPage({ uid: interaction.uid, clientId }));
      return;
    }
    expectPrompt(interaction, 'consent');
    const account = findDevAccountBySub(accounts, interaction.session?.accountId ?? '');
    const requested = new Set((interaction.params.scope ?? '').split(' ').filter(Boolean));
    sendHtml(
      res,
      200,
      renderConsentPage({
        uid: interaction.uid,
        clientId,
        accountEmail: account?.email ?? 'an unknown account',
        scopes: ['openid', 'email', 'profile'].filter((scope) => requested.has(scope)),
      }),
    );
  });

  router.post('/:uid/login', parseForm, async (req, res) => {
    const interaction = await provider.interactionDetails(req, res);
    expectPrompt(interaction, 'login');
    const email = formField(req, 'email');
    const account = matchDevAccount(accounts, email, formField(req, 'password'));
    if (!account) {
      const page = renderLoginPage({
        uid: interaction.uid,
        clientId: interaction.params.client_id,
        email,
        problem: WRONG_CREDENTIALS_MESSAGE,
      });
      sendHtml(res, 401, page);
      return;
    }
    await provider.interactionFinished(req, res, { login: { accountId: account.sub } }, { mergeWithLastSubmission: false });
  });

  router.post('/:uid/confirm', async (req, res) => {
    const interaction = await provider.interactionDetails(req, res);
    expectPrompt(interaction, 'consent');
    const accountId = interaction.session?.accountId;
    if (!accountId) throw new InteractionPageError(400, 'Sign in before giving consent.');
    const { details } = interaction.prompt;
    const existing = interaction.grantId ? await provider.Grant.find(interaction.grantId) : undefined;
    const grant = existing ?? new provider.Grant({ accountId, clientId: interaction.params.client_id });
    if (details.missingOIDCScope) grant.addOIDCScope(details.missingOIDCScope.join(' '));
    if (details.missingOIDCClaims) grant.addOIDCClaims(details.missingOIDCClaims);
    const grantId = await grant.save();
    await provider.interactionFinished(req, res, { consent: { grantId } }, { mergeWithLastSubmission: true });
  });

  router.post('/:uid/abort', async (req, res) => {
    await provider.interactionDetails(req, res);
    await provider.interactionFinished(
      req,
      res,
      { error: 'access_denied', error_description: 'The person declined at the local sign-in stand-in.' },
      { mergeWithLastSubmission: false },
    );
  });

  router.use((error: unknown, _req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    if (error instanceof InteractionPageError) {
      sendHtml(res, error.status, renderNoticePage('This sign-in step cannot be shown', [error.message]));
      return;
    }
    if (error instanceof errors.SessionNotFound) {
      const lines = ['This sign-in attempt has expired or its cookie is missing.', 'Start again from the application.'];
      sendHtml(res, 400, renderNoticePage('Sign-in attempt not found', lines));
      return;
    }
    next(error);
  });

  return router;
}
