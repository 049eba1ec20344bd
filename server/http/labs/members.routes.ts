import { changeRoleSchema, memberParams, type MemberAnswer, type MembersAnswer } from '../../contract/members.ts';
import { presentMember } from '../presenters/labs.presenter.ts';
import type { MembersService } from '../../services/members.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** Members of a lab: read by admin, technician and scientist; managed by admins; anyone may leave. */
export function memberRoutes(deps: { members: MembersService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/members',
      auth: { permission: 'members.read' },
      summary: 'List the members of the lab with their roles.',
      response: { status: 200, description: 'The members with their roles.' },
      handle: async ({ lab }): Promise<MembersAnswer> => ({ members: (await deps.members.list(lab)).map(presentMember) }),
    }),
    defineRoute({
      method: 'patch',
      path: '/members/:userId',
      auth: { permission: 'members.manage' },
      summary: "Change a member's role.",
      params: memberParams,
      body: changeRoleSchema,
      response: { status: 200, description: 'The member with their new role.' },
      errors: { 409: '`last_admin`: the lab would be left without an admin.' },
      handle: async ({ lab, actor, params, body }): Promise<MemberAnswer> => ({
        member: presentMember(await deps.members.changeRole(lab, actor, params.userId, body.role)),
      }),
    }),
    defineRoute({
      method: 'delete',
      path: '/members/:userId',
      auth: { permission: 'members.manage' },
      summary: 'Remove a member from the lab.',
      params: memberParams,
      response: { status: 204, description: 'Removed.' },
      errors: { 409: '`last_admin`: the lab would be left without an admin.' },
      handle: async ({ lab, actor, params }) => deps.members.remove(lab, actor, params.userId),
    }),
    defineRoute({
      method: 'delete',
      path: '/membership',
      auth: { permission: 'lab.read' },
      summary: 'Leave the lab yourself.',
      response: { status: 204, description: 'You left the lab.' },
      errors: { 409: '`last_admin`: the last admin cannot leave; make someone else admin first, or delete the lab (`POST …/deletion`).' },
      handle: async ({ lab, actor }) => deps.members.remove(lab, actor, actor.id),
    }),
  ];
}
