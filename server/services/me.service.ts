import type { LabMembershipSummary } from '../db/labs.repo.ts';
import type { CrossLabRepo } from '../db/cross-lab.repo.ts';
import type { User, UsersRepo } from '../db/users.repo.ts';
import { UnauthenticatedError } from '../errors.ts';
import type { Actor } from './lab-context.ts';

export interface MeView {
  user: User;
  labs: LabMembershipSummary[];
}

/** Who is signed in and which labs they belong to, for the client's shell and lab switcher; their own settings. */
export function createMeService(deps: { labs: Pick<CrossLabRepo, 'labsOf'>; users: UsersRepo }) {
  /** The person's own row (their settings are not part of the acting person); gone means signed out. */
  async function userOf(actor: Pick<Actor, 'id'>): Promise<User> {
    const user = await deps.users.findById(actor.id);
    if (!user) throw new UnauthenticatedError();
    return user;
  }

  return {
    async describe(actor: Pick<Actor, 'id'>): Promise<MeView> {
      const user = await userOf(actor);
      return { user, labs: await deps.labs.labsOf(user.id) };
    },

    /** The person's own time zone for alert mails (an IANA name the schema has checked), or null to clear it. */
    async setTimeZone(actor: Pick<Actor, 'id'>, timeZone: string | null): Promise<MeView> {
      const user = await userOf(actor);
      await deps.users.setTimeZone(user.id, timeZone);
      return { user: { ...user, timeZone }, labs: await deps.labs.labsOf(user.id) };
    },
  };
}

export type MeService = ReturnType<typeof createMeService>;
