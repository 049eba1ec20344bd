import { NavLink } from 'react-router-dom';

export interface SectionTab {
  label: string;
  to: string;
  /** Current only on this exact path (an overview); otherwise also on the pages below it. */
  exact?: boolean;
}

/**
 * A row of section tabs as links, the current one marked with `aria-current="page"` and an
 * amber underline. A section stays current on its sub-pages (a logger under "Loggers")
 * unless it is marked `exact`. On a phone the tabs wrap onto several lines, each at least
 * 44 px tall so a finger can hit it.
 */
export function SectionTabs({ label, tabs }: { label: string; tabs: SectionTab[] }) {
  return (
    <nav aria-label={label} className="mt-5 border-b border-rule">
      <ul className="flex flex-wrap gap-1">
        {tabs.map((tab) => (
          <li key={tab.label}>
            <NavLink
              to={tab.to}
              end={tab.exact}
              className="-mb-px inline-flex min-h-11 min-w-11 items-center justify-center rounded-t-lg border-b-2 border-transparent px-3 py-2 text-sm font-medium text-ink-soft sm:px-4 hover:text-ink aria-[current=page]:border-amber aria-[current=page]:text-ink"
            >
              {tab.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
