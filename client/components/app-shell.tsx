import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Logo } from './logo.tsx';
import { paths } from '../app/paths.ts';

/**
 * The frame around every signed-in page: a spruce band with the mark, the person's name
 * and a sign-out button, and the page itself on paper below.
 */
export function AppShell({ userName, onSignOut, children }: { userName: string; onSignOut: () => void; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="bg-spruce text-paper">
        <div className="mx-auto flex max-w-6xl items-center justify-between px-6 py-3">
          <Link to={paths.home.href()} className="rounded text-paper">
            <Logo />
          </Link>
          <div className="flex items-center gap-4 text-sm">
            <span data-testid="signed-in-name" className="font-medium">
              {userName}
            </span>
            <button
              type="button"
              onClick={onSignOut}
              className="rounded-md border border-paper/40 px-3 py-1 hover:bg-paper/10"
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-6 py-8">{children}</main>
    </div>
  );
}
