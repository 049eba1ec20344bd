import type { ClockChoice } from '../contract/me.ts';
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

    /**
     * The person's own settings, each only when given: their time zone (an IANA name the schema
     * has checked, or null to clear it) and which clock times are shown on (app and alert mails).
     */
    async updateSettings(actor: Pick<Actor, 'id'>, changes: { timeZone?: string | null; clock?: ClockChoice }): Promise<MeView> {
      const user = await userOf(actor);
      if (changes.timeZone !== undefined) await deps.users.setTimeZone(user.id, changes.timeZone);
      if (changes.clock !== undefined) await deps.users.setClock(user.id, changes.clock);
      return { user: { ...user, ...changes }, labs: await deps.labs.labsOf(user.id) };
    },
  };
}

export type MeService = ReturnType<typeof createMeService>;
