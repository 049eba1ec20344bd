import { z } from 'zod';
import { ROLES, type Role } from '../policies/permissions.ts';
import { idParams, type IsoTime } from './common.ts';

/** The members of a lab: who belongs, with which role. Shared by the routes, the services and the client. */

export const roleSchema = z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` });

/** `/members/:userId`. */
export const memberParams = idParams('userId');

/** `PATCH …/members/:userId`. */
export const changeRoleSchema = z.object({ role: roleSchema });
export type ChangeRoleInput = z.infer<typeof changeRoleSchema>;

/** One member as the lab's members see them. */
export interface Member {
  userId: number;
  name: string;
  email: string;
  role: Role;
  joinedAt: IsoTime;
}

/** `GET …/members`. */
export interface MembersAnswer {
  members: Member[];
}

/** `PATCH …/members/:userId`. */
export interface MemberAnswer {
  member: Member;
}
