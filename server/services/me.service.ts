import type { LabsRepo, LabMembershipSummary } from '../db/labs.repo.ts';
import type { User } from '../db/users.repo.ts';

export interface MeView {
  user: User;
  labs: LabMembershipSummary[];
}

/** Who is signed in and which labs they belong to, for the client's shell and lab switcher. */
export function createMeService(deps: { labs: LabsRepo }) {
  return {
    async describe(user: User): Promise<MeView> {
      return { user, labs: await deps.labs.listForUser(user.id) };
    },
  };
}

export type MeService = ReturnType<typeof createMeService>;
