import type { LabOverviewAnswer } from '../../contract/overview.ts';
import type { LabOverviewService } from '../../services/lab-overview.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** `GET /api/v1/labs/:lab/overview`: what needs attention in the lab, as the caller's role may see it. */
export function overviewRoutes(deps: { overview: LabOverviewService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/overview',
      auth: { permission: 'lab.read' },
      summary:
        'What needs attention in the lab: silent and out-of-range channels, open alerts, quarantined rows, loggers with unused or no keys, usage against the plan and the last upload — each part only for roles that may see it; a lab without loggers gets its first steps.',
      response: { status: 200, description: 'The overview: counts, the few most urgent entries of each part with the ids to link to, or the first steps.' },
      handle: async ({ lab }): Promise<LabOverviewAnswer> => deps.overview.overview(lab),
    }),
  ];
}
