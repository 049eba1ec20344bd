import { z } from 'zod';
import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { changeRoleSchema } from './labs.schema.ts';
import { presentMember } from '../presenters/labs.presenter.ts';
import type { MembersService } from '../../services/members.service.ts';
import type { LabRoute } from '../lab-routes.ts';

const userIdParam = z.object({ userId: z.coerce.number().int('must be a whole number').positive('must be a positive number') });

/** Members of a lab: read by admin, technician and scientist; managed by admins; anyone may leave. */
export function memberRoutes(deps: { members: MembersService }): LabRoute[] {
  return [
    {
      method: 'get',
      path: '/members',
      permission: 'members.read',
      summary: 'List the members of the lab with their roles.',
      handle: async (_req, res) => {
        const members = await deps.members.list(labOf(res));
        res.json({ members: members.map(presentMember) });
      },
    },
    {
      method: 'patch',
      path: '/members/:userId',
      permission: 'members.manage',
      summary: "Change a member's role.",
      body: changeRoleSchema,
      handle: async (req, res) => {
        const { userId } = parseInput(userIdParam, req.params);
        const { role } = parseInput(changeRoleSchema, req.body);
        const member = await deps.members.changeRole(labOf(res), actorOf(req), userId, role);
        res.json({ member: presentMember(member) });
      },
    },
    {
      method: 'delete',
      path: '/members/:userId',
      permission: 'members.manage',
      summary: 'Remove a member from the lab.',
      handle: async (req, res) => {
        const { userId } = parseInput(userIdParam, req.params);
        await deps.members.remove(labOf(res), actorOf(req), userId);
        res.status(204).end();
      },
    },
    {
      method: 'delete',
      path: '/membership',
      permission: 'lab.read',
      summary: 'Leave the lab yourself.',
      handle: async (req, res) => {
        const actor = actorOf(req);
        await deps.members.remove(labOf(res), actor, actor.id);
        res.status(204).end();
      },
    },
  ];
}
