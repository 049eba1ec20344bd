import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Logo } from './logo.tsx';
import { LabSwitcher, type SwitcherLab } from './lab-switcher.tsx';
import { paths } from '../app/paths.ts';

/**
 * The frame around every signed-in page: a spruce band with the mark, the lab switcher,
 * the person's name (a link to their account settings) and a sign-out button, and the page
 * itself on paper below. On a phone the band wraps and its links are 44 px tall (touch
 * targets); the page keeps a narrower margin.
 */
export function AppShell({ userName, labs, onSignOut, children }: { userName: string; labs: SwitcherLab[]; onSignOut: () => void; children: ReactNode }) {
  // The lab in the URL (`/labs/:lab/...`), if any: the switcher names it as the current one.
  const { lab: currentSlug } = useParams();
  return (
    <div className="min-h-screen">
      <header className="bg-spruce text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-x-3 gap-y-1 px-4 py-2 sm:px-6 sm:py-3">
          <div className="flex min-w-0 flex-wrap items-center gap-x-5 gap-y-1">
            <Link to={paths.home.href()} className="inline-flex min-h-11 items-center rounded text-paper">
              <Logo />
            </Link>
            <LabSwitcher labs={labs} currentSlug={currentSlug} />
          </div>
          <div className="flex min-w-0 flex-wrap items-center gap-x-4 text-sm">
            <Link
              to={paths.apiReference.href()}
              className="inline-flex min-h-11 items-center rounded underline-offset-2 hover:underline"
              title="Lagbook's HTTP API"
            >
              API
            </Link>
            <Link
              to={paths.account.href()}
              data-testid="signed-in-name"
              className="inline-flex min-h-11 min-w-0 items-center break-all rounded font-medium underline-offset-2 hover:underline"
              title="Your account"
            >
              {userName}
            </Link>
            <button type="button" onClick={onSignOut} className="min-h-11 rounded-md border border-paper/40 px-3 py-1 hover:bg-paper/10 sm:min-h-0">
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6 sm:px-6 sm:py-8">{children}</main>
    </div>
  );
}
