import { createLabSchema, type CreatedLab, type LabDetail } from '../../contract/labs.ts';
import { presentCreatedLab, presentLabForMember } from '../presenters/labs.presenter.ts';
import type { LabsService } from '../../services/labs.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/**
 * Labs: any signed-in person creates one (up to their account's cap) and becomes its admin;
 * a member reads the lab with their role and what it allows.
 */
export function labRoutes(deps: { labs: LabsService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '',
      auth: { permission: 'lab.read' },
      summary: 'The lab, your role in it and what that role may do.',
      response: { status: 200, description: 'The lab (`slug`, `name`, `createdAt`), your `role` and its `permissions`.' },
      handle: async ({ lab }): Promise<LabDetail> => presentLabForMember(lab, lab.role),
    }),
    /*
     * 201 with the lab and `requestedSlug`, the address asked for (or derived from the name): when
     * that one was unavailable the lab got a variant (`lab.slug` differs), and the answer is
     * otherwise the same, so it never tells whether some other lab uses an address.
     */
    defineRoute({
      method: 'post',
      path: '/api/v1/labs',
      auth: 'session',
      summary: 'Create a lab; the signed-in person becomes its admin.',
      body: createLabSchema,
      response: {
        status: 201,
        description:
          '`{ lab: { slug, name, role }, requestedSlug }`. requestedSlug is the address asked for (or derived from the name); when it was unavailable the lab got the first free variant (`…-2` … `…-9`, else a random suffix) and lab.slug differs. The answer never says whether another lab uses an address.',
      },
      errors: {
        403: '`lab_limit_reached`: the person has created as many labs as one account may (LAGBOOK_MAX_LABS_PER_ACCOUNT, default 3; LAGBOOK_MAX_LABS_PER_PAID_ADMIN, default 10, for an admin of a lab on a paid plan). The message names the cap. Also `cross_site_request`: a write from another site.',
        409: '`slug_busy`: many labs were being created at this address at the same moment; try again.',
      },
      handle: async ({ actor, body }): Promise<CreatedLab> => presentCreatedLab(await deps.labs.create(actor, body)),
    }),
  ];
}
