import type { LabsRepo, LabMembershipSummary } from '../db/labs.repo.ts';
import type { User, UsersRepo } from '../db/users.repo.ts';

export interface MeView {
  user: User;
  labs: LabMembershipSummary[];
}

/** Who is signed in and which labs they belong to, for the client's shell and lab switcher; their own settings. */
export function createMeService(deps: { labs: LabsRepo; users: UsersRepo }) {
  return {
    async describe(user: User): Promise<MeView> {
      return { user, labs: await deps.labs.listForUser(user.id) };
    },

    /** The person's own time zone for alert mails (an IANA name the schema has checked), or null to clear it. */
    async setTimeZone(user: User, timeZone: string | null): Promise<MeView> {
      await deps.users.setTimeZone(user.id, timeZone);
      return { user: { ...user, timeZone }, labs: await deps.labs.listForUser(user.id) };
    },
  };
}

export type MeService = ReturnType<typeof createMeService>;
