import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths.ts';
import { buttonClasses } from '../../../components/button.tsx';

/**
 * What a person sees for a lab that does not exist or that they do not belong to. The two
 * cases read the same on purpose: the server never reveals whether a lab exists.
 */
export function LabNotFound({ slug }: { slug: string }) {
  return (
    <section className="max-w-xl rounded-2xl border border-rule bg-card p-8">
      <h1 className="text-2xl font-semibold">Lab not found or no access</h1>
      <p className="mt-2 text-ink-soft">
        There is no lab at <span className="font-mono">/labs/{slug}</span> that you belong to. If you expected one, ask one of its admins for an invitation.
      </p>
      <Link to={paths.home.href()} className={`mt-5 ${buttonClasses('secondary')}`}>
        Back to your labs
      </Link>
    </section>
  );
}

/** What a member sees on a section their role does not include. */
export function MissingPermission({ what }: { what: string }) {
  return (
    <p role="status" className="rounded-lg border border-rule bg-card p-4 text-ink-soft">
      Your role in this lab does not include {what}. A lab admin can change your role.
    </p>
  );
}
