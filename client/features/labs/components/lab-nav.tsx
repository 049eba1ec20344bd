import { NavLink } from 'react-router-dom';
import type { Permission } from '../../../../server/policies/permissions.ts';
import { visibleSections } from './lab-sections.ts';

/** The lab's section tabs, showing only what the member's role may open. */
export function LabNav({ slug, permissions }: { slug: string; permissions: readonly Permission[] }) {
  return (
    <nav aria-label="Lab sections" className="mt-5 border-b border-rule">
      <ul className="flex gap-1">
        {visibleSections(permissions).map((section) => (
          <li key={section.label}>
            <NavLink
              to={section.href(slug)}
              end
              className="-mb-px inline-block rounded-t-lg border-b-2 border-transparent px-4 py-2 text-sm font-medium text-ink-soft hover:text-ink aria-[current=page]:border-amber aria-[current=page]:text-ink"
            >
              {section.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
