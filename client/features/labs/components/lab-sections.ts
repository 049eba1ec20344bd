import type { Permission } from '@shared/policies/permissions.ts';
import { paths } from '../../../app/paths.ts';

export interface LabSection {
  label: string;
  href: (slug: string) => string;
  /** The permission a role needs to see the section at all. */
  needs: Permission;
  /** What the section is for, as shown on the lab's overview. */
  blurb: string;
}

/** The sections of a lab, in navigation order. */
export const LAB_SECTIONS: LabSection[] = [
  { label: 'Overview', href: paths.lab.href, needs: 'lab.read', blurb: 'The lab at a glance.' },
  {
    label: 'Channels',
    href: paths.labChannels.href,
    needs: 'channels.read',
    blurb: 'Every channel with its status and last day; readings, diagnostics and cross-correlation.',
  },
  {
    label: 'Alerts',
    href: paths.labAlerts.href,
    needs: 'alerts.read',
    blurb: 'Open and recent alerts, and the rules that mail people when a channel goes quiet or strays.',
  },
  {
    label: 'Notes',
    href: paths.labNotes.href,
    needs: 'channels.read',
    blurb: 'Why data look as they do: cleanings, calibrations, sensor changes; the kinds of note the lab uses.',
  },
  { label: 'Loggers', href: paths.labLoggers.href, needs: 'loggers.read', blurb: 'The data loggers, their channels and keys; historical uploads.' },
  {
    label: 'Quarantine',
    href: paths.labQuarantine.href,
    needs: 'quarantine.review',
    blurb: 'Readings that could not be stored, with the reason, to fix or discard.',
  },
  { label: 'Members', href: paths.labMembers.href, needs: 'members.read', blurb: 'Who belongs to the lab, and in which role.' },
  { label: 'Audit log', href: paths.labAudit.href, needs: 'audit.read', blurb: 'Every admin action — members, keys, loggers, quarantine — newest first.' },
  {
    label: 'API tokens',
    href: paths.labTokens.href,
    needs: 'tokens.manage-own',
    blurb: 'Your personal tokens for reading the lab’s data from notebooks and scripts.',
  },
  {
    label: 'Billing',
    href: paths.labBilling.href,
    needs: 'billing.manage',
    blurb: 'The plan, storage and other usage against its limits, payment and invoices.',
  },
  {
    label: 'Lab settings',
    href: paths.labSettings.href,
    needs: 'lab.manage',
    blurb: 'The lab’s name and description, a full export of its data, and deleting the lab.',
  },
];

/** The sections a member with `permissions` may open; the server refuses the rest anyway. */
export function visibleSections(permissions: readonly Permission[]): LabSection[] {
  return LAB_SECTIONS.filter((section) => permissions.includes(section.needs));
}
