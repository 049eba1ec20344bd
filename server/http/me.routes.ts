import { updateMeSchema, type Me } from '../contract/me.ts';
import type { MeService } from '../services/me.service.ts';
import { presentMe } from './presenters/me.presenter.ts';
import { defineRoute, type Route } from './routes/route.ts';

/** `GET /api/v1/me`: the signed-in person and their labs; `PATCH /api/v1/me`: their own settings. */
export function meRoutes(deps: { me: MeService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/api/v1/me',
      auth: 'session',
      summary: 'The signed-in person and the labs they belong to.',
      response: {
        status: 200,
        description: 'The person (`id`, `email`, `name`, `timeZone`, `clock`: `logger`, `mine` or `utc`) and their labs with their role in each.',
      },
      handle: async ({ actor }): Promise<Me> => presentMe(await deps.me.describe(actor)),
    }),
    defineRoute({
      method: 'patch',
      path: '/api/v1/me',
      auth: 'session',
      summary:
        "The signed-in person's own settings: their time zone (null clears it) and which clock times are shown on in the app and in alert mails (`logger`: readings on the logger's clock, the rest on theirs; `mine`; `utc`). Send either or both.",
      body: updateMeSchema,
      response: { status: 200, description: 'The person and their labs, with the settings saved.' },
      handle: async ({ actor, body }): Promise<Me> => presentMe(await deps.me.updateSettings(actor, body)),
    }),
  ];
}
