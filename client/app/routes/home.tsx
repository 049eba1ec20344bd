import { Link, useOutletContext } from 'react-router-dom';
import type { Me } from '@shared/contract/me.ts';
import { LabCards } from '../../features/labs/components/lab-cards.tsx';
import { LabDeletedNotice } from '../../features/labs/components/lab-deleted-notice.tsx';
import { buttonClasses } from '../../components/button.tsx';
import { paths } from '../paths.ts';

/** The signed-in landing page: a greeting and the person's labs, or the way to start one. */
export default function HomeRoute() {
  const me = useOutletContext<Me>();
  return (
    <section>
      <LabDeletedNotice />
      <h1 className="text-2xl font-semibold">Welcome, {me.user.name}</h1>
      <p className="mt-1 text-ink-soft">Signed in as {me.user.email}</p>
      <div className="mt-8 flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-lg font-semibold">Your labs</h2>
        {me.labs.length > 0 && (
          <Link to={paths.createLab.href()} className={buttonClasses('secondary', 'sm')}>
            Create a lab
          </Link>
        )}
      </div>
      {me.labs.length === 0 ? (
        <div className="mt-3 max-w-xl rounded-xl border border-dashed border-rule bg-card p-6">
          <p>You do not belong to a lab yet.</p>
          <p className="mt-1 text-sm text-ink-soft">Start one for your group and invite your colleagues, or open the invitation link an admin sent you.</p>
          <Link to={paths.createLab.href()} className={`mt-4 ${buttonClasses('primary')}`}>
            Create a lab
          </Link>
        </div>
      ) : (
        <div className="mt-3">
          <LabCards labs={me.labs} />
        </div>
      )}
    </section>
  );
}
