import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { createPersonalTokenSchema, tokenIdParams } from './tokens.schema.ts';
import { presentIssuedPersonalToken, presentPersonalToken } from './tokens.presenter.ts';
import type { PersonalTokensService } from '../../services/personal-tokens.service.ts';
import type { LabRoute } from '../lab-routes.ts';

/** A member's own personal API tokens in a lab: list, make (shown once), revoke. */
export function tokenRoutes(deps: { tokens: PersonalTokensService }): LabRoute[] {
  const { tokens } = deps;
  return [
    {
      method: 'get',
      path: '/tokens',
      permission: 'tokens.manage-own',
      summary: 'List your own personal API tokens in this lab (never their secrets).',
      handle: async (req, res) => {
        res.json({ tokens: (await tokens.listOwn(labOf(res), actorOf(req))).map(presentPersonalToken) });
      },
    },
    {
      method: 'post',
      path: '/tokens',
      permission: 'tokens.manage-own',
      summary: 'Make a personal API token for the read routes; the token is shown once.',
      body: createPersonalTokenSchema,
      handle: async (req, res) => {
        const input = parseInput(createPersonalTokenSchema, req.body);
        res.status(201).json(presentIssuedPersonalToken(await tokens.create(labOf(res), actorOf(req), input)));
      },
    },
    {
      method: 'delete',
      path: '/tokens/:tokenId',
      permission: 'tokens.manage-own',
      summary: 'Revoke one of your own personal API tokens; it stops working at once.',
      handle: async (req, res) => {
        const { tokenId } = parseInput(tokenIdParams, req.params);
        await tokens.revokeOwn(labOf(res), actorOf(req), tokenId);
        res.status(204).end();
      },
    },
  ];
}
