import { createLabSchema, deleteLabSchema, updateLabSchema, type CreatedLab, type LabDeletionStarted, type LabDetail } from '../../contract/labs.ts';
import { presentCreatedLab, presentLabForMember } from '../presenters/labs.presenter.ts';
import type { LabsService } from '../../services/labs.service.ts';
import type { LabExportService } from '../../services/lab-export/lab-export.service.ts';
import type { LabDeletionService } from '../../services/lab-deletion/lab-deletion.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';
import { writeLabExportZip } from './lab-export-zip.ts';

/**
 * Labs: any signed-in person creates one (up to their account's cap) and becomes its admin;
 * a member reads the lab with their role and what it allows; admins rename it, describe it,
 * download everything in it and delete it.
 */
export function labRoutes(deps: { labs: LabsService; exports: LabExportService; deletions: LabDeletionService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '',
      auth: { permission: 'lab.read' },
      summary: 'The lab, your role in it and what that role may do.',
      response: { status: 200, description: 'The lab (`slug`, `name`, `description`, `createdAt`), your `role` and its `permissions`.' },
      handle: async ({ lab }): Promise<LabDetail> => presentLabForMember(deps.labs.detail(lab), lab.role),
    }),
    defineRoute({
      method: 'patch',
      path: '',
      auth: { permission: 'lab.manage' },
      summary: 'Rename the lab or change its description (the address stays, so links keep working).',
      body: updateLabSchema,
      response: { status: 200, description: 'The lab as it is now, with your role and permissions (as `GET`). Audit-logged (`lab.updated`).' },
      handle: async ({ lab, actor, body }): Promise<LabDetail> => presentLabForMember(await deps.labs.update(lab, actor, body), lab.role),
    }),
    defineRoute({
      method: 'get',
      path: '/export.zip',
      auth: { permission: 'lab.manage' },
      summary: 'Download everything in the lab: settings as JSON and one readings CSV per channel, in one zip.',
      response: {
        status: 200,
        description:
          'A zip, streamed: `ABOUT.txt`, `lab.json` (the lab, members with roles, loggers, channels with their settings, alert rules, notes) and `readings/logger-<id>/<channel key>.csv` per channel (time_utc, epoch_ms, value). Audit-logged (`lab.exported`).',
        mediaType: 'application/zip',
      },
      stream: true,
      handle: async ({ lab, actor }, { res }) => {
        const plan = await deps.exports.plan(lab);
        await deps.exports.recordExport(lab, actor, plan);
        const day = plan.settings.exportedAt.slice(0, 10);
        await writeLabExportZip(res, plan, (channelId) => deps.exports.readingPages(lab, channelId), `${lab.slug}-export-${day}`);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/deletion',
      auth: { permission: 'lab.manage' },
      summary: 'Delete the lab: type its name to confirm. Its subscription is cancelled and its data removed; this cannot be undone.',
      body: deleteLabSchema,
      response: {
        status: 202,
        description:
          'The lab is closed at once for everyone (its address answers 404, it leaves every lab list, its invitation links and logger keys stop working); its Stripe subscription was cancelled (`subscriptionCancelled`); its rows are being removed in the background. The deletion is recorded outside the lab.',
      },
      errors: {
        409: '`unpaid_invoice`: the lab has an unpaid invoice (its subscription is past due); pay it or cancel the subscription under Billing, then delete the lab. Nothing was changed.',
        503: '`billing_unavailable`: Stripe could not be reached to cancel the subscription, so the lab was not deleted; `service_unavailable`: the database is unreachable. Retry-After says when to try again.',
      },
      handle: async ({ lab, actor, body }): Promise<LabDeletionStarted> => deps.deletions.request(lab, actor, body),
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
