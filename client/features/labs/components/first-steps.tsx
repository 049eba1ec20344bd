import { Link } from 'react-router-dom';
import type { FirstStep } from '@shared/contract/overview.ts';
import { paths } from '../../../app/paths.ts';

const STEPS: Record<FirstStep, { title: string; detail: string; href: (slug: string) => string; action: string }> = {
  'register-logger': {
    title: 'Register a logger',
    detail: 'Name it, say where it stands and how often it reports; it gets a key to send its readings with.',
    href: paths.labLoggerNew.href,
    action: 'Register a logger',
  },
  'invite-colleague': {
    title: 'Invite a colleague',
    detail: 'Technicians look after loggers, scientists read and analyse, guests only look.',
    href: paths.labMembers.href,
    action: 'Invite someone',
  },
  'upload-history': {
    title: 'Upload history',
    detail: 'Have an export from before? Register the logger it came from, then upload the file from that logger’s page.',
    href: paths.labLoggerNew.href,
    action: 'Start with its logger',
  },
};

/** What a lab without loggers shows instead of empty panels: the steps the member's role may take. */
export function FirstSteps({ slug, steps }: { slug: string; steps: FirstStep[] }) {
  return (
    <section aria-labelledby="first-steps-heading" className="rounded-xl border border-rule bg-card p-5">
      <h3 id="first-steps-heading" className="text-lg font-semibold">
        This lab has no loggers yet
      </h3>
      {steps.length === 0 ? (
        <p className="mt-2 text-sm text-ink-soft">
          Once an admin or technician registers a logger, its channels and anything that needs attention appear here.
        </p>
      ) : (
        <ol className="mt-3 grid gap-3">
          {steps.map((step, i) => {
            const s = STEPS[step];
            return (
              <li key={step} className="grid grid-cols-[auto_1fr] gap-x-3">
                <span aria-hidden="true" className="mt-0.5 flex h-6 w-6 items-center justify-center rounded-full border border-lichen text-sm text-lichen-dark">
                  {i + 1}
                </span>
                <div>
                  <p className="font-medium">{s.title}</p>
                  <p className="text-sm text-ink-soft">{s.detail}</p>
                  <Link to={s.href(slug)} className="mt-1 inline-block text-sm font-medium text-lichen-dark underline">
                    {s.action}
                  </Link>
                </div>
              </li>
            );
          })}
        </ol>
      )}
    </section>
  );
}
