import { Link } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '@shared/policies/permissions.ts';
import { paths } from '../../../app/paths.ts';

/** The person's labs as cards that open each lab. */
export function LabCards({ labs }: { labs: Array<{ slug: string; name: string; role: Role }> }) {
  return (
    <ul className="grid gap-3 sm:grid-cols-2">
      {labs.map((lab) => (
        <li key={lab.slug}>
          <Link to={paths.lab.href(lab.slug)} className="block rounded-xl border border-rule bg-card p-4 hover:border-lichen">
            <span className="block font-medium text-lichen-dark">{lab.name}</span>
            <span className="block text-sm text-ink-soft">Your role: {ROLE_LABELS[lab.role]}</span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
