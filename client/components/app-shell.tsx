import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Logo } from './logo.tsx';
import { LabSwitcher, type SwitcherLab } from './lab-switcher.tsx';
import { paths } from '../app/paths.ts';

/**
 * The frame around every signed-in page: a spruce band with the mark, the lab switcher,
 * the person's name (a link to their account settings) and a sign-out button, and the page
 * itself on paper below.
 */
export function AppShell({ userName, labs, onSignOut, children }: { userName: string; labs: SwitcherLab[]; onSignOut: () => void; children: ReactNode }) {
  // The lab in the URL (`/labs/:lab/...`), if any: the switcher names it as the current one.
  const { lab: currentSlug } = useParams();
  return (
    <div className="min-h-screen">
      <header className="bg-spruce text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-6 py-3">
          <div className="flex items-center gap-5">
            <Link to={paths.home.href()} className="rounded text-paper">
              <Logo />
            </Link>
            <LabSwitcher labs={labs} currentSlug={currentSlug} />
          </div>
          <div className="flex items-center gap-4 text-sm">
            <Link to={paths.apiReference.href()} className="rounded underline-offset-2 hover:underline" title="Lagbook's HTTP API">
              API
            </Link>
            <Link
              to={paths.account.href()}
              data-testid="signed-in-name"
              className="rounded font-medium underline-offset-2 hover:underline"
              title="Your account"
            >
              {userName}
            </Link>
            <button type="button" onClick={onSignOut} className="rounded-md border border-paper/40 px-3 py-1 hover:bg-paper/10">
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-6 py-8">{children}</main>
    </div>
  );
}
