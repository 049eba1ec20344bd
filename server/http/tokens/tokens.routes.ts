import { createPersonalTokenSchema, tokenIdParams, type IssuedToken, type PersonalTokensAnswer } from '../../contract/tokens.ts';
import { presentIssuedPersonalToken, presentPersonalToken } from './tokens.presenter.ts';
import type { PersonalTokensService } from '../../services/personal-tokens.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** A member's own personal API tokens in a lab: list, make (shown once), revoke. */
export function tokenRoutes(deps: { tokens: PersonalTokensService }): Route[] {
  const { tokens } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/tokens',
      auth: { permission: 'tokens.manage-own' },
      summary: 'List your own personal API tokens in this lab (never their secrets).',
      response: { status: 200, description: 'Your tokens in this lab, metadata only.' },
      handle: async ({ lab, actor }): Promise<PersonalTokensAnswer> => ({ tokens: (await tokens.listOwn(lab, actor)).map(presentPersonalToken) }),
    }),
    defineRoute({
      method: 'post',
      path: '/tokens',
      auth: { permission: 'tokens.manage-own' },
      summary: 'Make a personal API token for the read routes; the token is shown once.',
      body: createPersonalTokenSchema,
      response: { status: 201, description: 'The whole token (shown this once) and its metadata.' },
      handle: async ({ lab, actor, body }): Promise<IssuedToken> => presentIssuedPersonalToken(await tokens.create(lab, actor, body)),
    }),
    defineRoute({
      method: 'delete',
      path: '/tokens/:tokenId',
      auth: { permission: 'tokens.manage-own' },
      summary: 'Revoke one of your own personal API tokens; it stops working at once.',
      params: tokenIdParams,
      response: { status: 204, description: 'Revoked.' },
      handle: async ({ lab, actor, params }) => tokens.revokeOwn(lab, actor, params.tokenId),
    }),
  ];
}
