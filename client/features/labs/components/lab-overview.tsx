import { Link } from 'react-router-dom';
import { ROLE_LABELS } from '@shared/policies/permissions.ts';
import { DateTime } from '../../../components/date-time.tsx';
import type { LabDetail } from '@shared/contract/labs.ts';
import { visibleSections } from './lab-sections.ts';

/** The lab's home: its address, when it was created, your role, and the sections you can open. */
export function LabOverview({ detail }: { detail: LabDetail }) {
  const { lab, role, permissions } = detail;
  const sections = visibleSections(permissions).filter((s) => s.needs !== 'lab.read');
  return (
    <div className="grid gap-6 md:grid-cols-[2fr_3fr]">
      <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 rounded-xl border border-rule bg-card p-5 text-sm">
        <dt className="text-ink-soft">Your role</dt>
        <dd className="font-medium">{ROLE_LABELS[role]}</dd>
        <dt className="text-ink-soft">Address</dt>
        <dd className="font-mono">/labs/{lab.slug}</dd>
        <dt className="text-ink-soft">Created</dt>
        <dd>
          <DateTime iso={lab.createdAt} dateOnly />
        </dd>
      </dl>
      {sections.length > 0 && (
        <ul className="grid gap-3">
          {sections.map((section) => (
            <li key={section.label}>
              <Link to={section.href(lab.slug)} className="block rounded-xl border border-rule bg-card p-4 hover:border-lichen">
                <span className="font-medium text-lichen-dark">{section.label}</span>
                <span className="block text-sm text-ink-soft">{section.blurb}</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
