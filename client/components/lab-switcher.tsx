import { useId, useRef, useState, type FocusEvent, type KeyboardEvent } from 'react';
import { Link, matchPath, useLocation } from 'react-router-dom';
import { paths } from '../app/paths.ts';
import { PLACES_OUTSIDE_LABS, SWITCHER_WORDS } from '../features/labs/messages.ts';
import { ROLE_LABELS } from '@shared/policies/permissions.ts';
import type { Me } from '@shared/contract/me.ts';

/** One of the person's labs, as `GET /api/v1/me` lists it. */
export type SwitcherLab = Me['labs'][number];

/** The page outside any lab the person is on, in words (the switcher names it where no lab is open). */
export function placeOutsideLabs(pathname: string): string {
  const on = (path: string) => matchPath({ path, end: true }, pathname) !== null;
  if (on(paths.home.path)) return PLACES_OUTSIDE_LABS.home;
  if (on(paths.account.path)) return PLACES_OUTSIDE_LABS.account;
  if (on(paths.apiReference.path)) return PLACES_OUTSIDE_LABS.apiReference;
  if (on(paths.createLab.path)) return PLACES_OUTSIDE_LABS.createLab;
  if (on(paths.joinLab.path)) return PLACES_OUTSIDE_LABS.joinLab;
  if (matchPath({ path: paths.lab.path, end: false }, pathname)) return PLACES_OUTSIDE_LABS.otherLab;
  return PLACES_OUTSIDE_LABS.elsewhere;
}

/**
 * The lab switcher in the top band: a disclosure button naming the current lab that opens a
 * list of the person's labs (each a link to `/labs/:slug`) and "Create a lab". On a page that
 * belongs to no lab (Your account, the API reference …) it names that page and offers the labs
 * to go to, instead of asking to choose one. Links, not a
 * select, so arrowing through choices never navigates by accident; Escape closes the list
 * and returns focus, and so does moving focus out of it.
 */
export function LabSwitcher({ labs, currentSlug }: { labs: SwitcherLab[]; currentSlug?: string }) {
  const [open, setOpen] = useState(false);
  const listId = useId();
  const buttonRef = useRef<HTMLButtonElement>(null);
  const current = labs.find((lab) => lab.slug === currentSlug);
  const { pathname } = useLocation();

  function close(refocus: boolean) {
    setOpen(false);
    if (refocus) buttonRef.current?.focus();
  }

  return (
    <div
      className="relative"
      onKeyDown={(e: KeyboardEvent) => {
        if (e.key === 'Escape' && open) close(true);
      }}
      onBlur={(e: FocusEvent<HTMLDivElement>) => {
        if (open && !e.currentTarget.contains(e.relatedTarget as Node | null)) close(false);
      }}
    >
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-2 rounded-md border border-paper/30 px-3 py-1 text-sm hover:bg-paper/10"
      >
        <span className="text-paper/70">{current ? SWITCHER_WORDS.inLab : placeOutsideLabs(pathname)}</span>
        <span className="font-medium">{current ? current.name : labs.length ? SWITCHER_WORDS.goToLab : SWITCHER_WORDS.noLabYet}</span>
        <span aria-hidden="true" className="text-amber">
          {open ? '▴' : '▾'}
        </span>
      </button>
      <div id={listId} hidden={!open} className="absolute left-0 z-20 mt-2 w-72 rounded-xl border border-rule bg-card p-2 text-ink shadow-lg">
        {labs.length > 0 && (
          <ul aria-label={SWITCHER_WORDS.yourLabs}>
            {labs.map((lab) => (
              <li key={lab.slug}>
                <Link
                  to={paths.lab.href(lab.slug)}
                  aria-current={lab.slug === currentSlug ? 'page' : undefined}
                  onClick={() => close(false)}
                  className="flex items-baseline justify-between gap-3 rounded-lg px-3 py-2 hover:bg-paper aria-[current=page]:bg-paper aria-[current=page]:font-semibold"
                >
                  <span>{lab.name}</span>
                  <span className="text-xs text-ink-soft">{ROLE_LABELS[lab.role]}</span>
                </Link>
              </li>
            ))}
          </ul>
        )}
        <Link
          to={paths.createLab.href()}
          onClick={() => close(false)}
          className="mt-1 block rounded-lg border-t border-rule px-3 py-2 font-medium text-lichen-dark hover:bg-paper"
        >
          {SWITCHER_WORDS.createLab}
        </Link>
      </div>
    </div>
  );
}
