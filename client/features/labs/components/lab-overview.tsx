import type { ComponentType } from 'react';
import { Link } from 'react-router-dom';
import { ROLE_LABELS } from '@shared/policies/permissions.ts';
import type { LabDetail } from '@shared/contract/labs.ts';
import type { LabOverviewAnswer, OverviewChannel } from '@shared/contract/overview.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { visibleSections } from './lab-sections.ts';
import { attentionEntries, type AttentionEntry, type AttentionKind, type ReasonLabel } from './attention-items.ts';
import { FirstSteps } from './first-steps.tsx';
import { OverviewPanels } from './overview-panels.tsx';

/** What the page borrows from other features, handed in by the route (features never import each other). */
export interface OverviewHelpers {
  /** The quarantine page's name for a reason code. */
  reasonLabel: ReasonLabel;
  /** Whether a channel watches something valuable (freezer, incubator, safety gas): the channels' safety rule. */
  needsCaution: (c: OverviewChannel) => boolean;
  /** The channels' safety caution, shown once under the list when such a channel needs attention. */
  CautionNote: ComponentType<{ channel: OverviewChannel }>;
}

const KIND_LOOK: Record<AttentionKind, { word: string; tone: string }> = {
  'open-alerts': { word: 'Alert', tone: 'border-alert/40 bg-alert/5 text-alert' },
  'out-of-range': { word: 'Out of range', tone: 'border-alert/40 bg-alert/5 text-alert' },
  silent: { word: 'Silent', tone: 'border-ink-soft/40 bg-paper text-ink-soft' },
  quarantine: { word: 'Quarantine', tone: 'border-amber bg-amber/10 text-ink' },
  'unused-key': { word: 'Key', tone: 'border-rule bg-paper text-ink-soft' },
  'no-key': { word: 'Key', tone: 'border-rule bg-paper text-ink-soft' },
  plan: { word: 'Plan', tone: 'border-amber bg-amber/10 text-ink' },
};

function AttentionList({ entries, helpers }: { entries: AttentionEntry[]; helpers: OverviewHelpers }) {
  const valuable = entries.find((e) => e.channel && helpers.needsCaution(e.channel))?.channel;
  return (
    <section aria-labelledby="attention-heading" className="grid gap-3">
      <h3 id="attention-heading" className="text-lg font-semibold">
        Needs attention
      </h3>
      {entries.length === 0 ? (
        <p className="rounded-xl border border-rule bg-card p-4 text-sm">Nothing needs attention right now.</p>
      ) : (
        <ul aria-label="Needs attention" className="grid gap-2">
          {entries.map((e) => {
            const look = KIND_LOOK[e.kind];
            const careful = e.channel && helpers.needsCaution(e.channel);
            return (
              <li key={e.key}>
                <Link
                  to={e.href}
                  data-kind={e.kind}
                  className="grid grid-cols-[auto_1fr] items-start gap-x-3 rounded-xl border border-rule bg-card p-3 text-sm hover:border-lichen"
                >
                  <span className={`mt-0.5 whitespace-nowrap rounded-md border px-2 py-0.5 text-xs font-medium ${look.tone}`}>{look.word}</span>
                  <span className="min-w-0">
                    <span className="block font-medium text-lichen-dark">{e.title}</span>
                    <span className="block break-words text-ink-soft">{e.detail}</span>
                    {careful && <span className="block text-xs">Watches something valuable: check it on site; your lab’s own alarms and rules apply.</span>}
                  </span>
                </Link>
              </li>
            );
          })}
        </ul>
      )}
      {valuable && <helpers.CautionNote channel={valuable} />}
    </section>
  );
}

function LabFacts({ detail }: { detail: LabDetail }) {
  const { lab, role } = detail;
  const description = lab.description.trim();
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 rounded-xl border border-rule bg-card p-5 text-sm">
      <dt className="text-ink-soft">Your role</dt>
      <dd className="font-medium">{ROLE_LABELS[role]}</dd>
      <dt className="text-ink-soft">Address</dt>
      <dd className="break-all font-mono">/labs/{lab.slug}</dd>
      <dt className="text-ink-soft">Created</dt>
      <dd>
        <Instant at={lab.createdAt} kind="account" part="date" />
      </dd>
      {description && (
        <>
          <dt className="text-ink-soft">About</dt>
          <dd className="whitespace-pre-line break-words">{description}</dd>
        </>
      )}
    </dl>
  );
}

function SectionLinks({ detail }: { detail: LabDetail }) {
  const sections = visibleSections(detail.permissions).filter((s) => s.needs !== 'lab.read');
  if (sections.length === 0) return null;
  return (
    <nav aria-label="Sections of the lab">
      <ul className="grid gap-3 sm:grid-cols-2">
        {sections.map((section) => (
          <li key={section.label}>
            <Link to={section.href(detail.lab.slug)} className="block h-full rounded-xl border border-rule bg-card p-4 hover:border-lichen">
              <span className="font-medium text-lichen-dark">{section.label}</span>
              <span className="block text-sm text-ink-soft">{section.blurb}</span>
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}

/**
 * The lab's home: what needs attention first (most urgent first, each a link to where it is dealt
 * with), then the lab's facts, then the parts of the overview and the sections. A lab without
 * loggers shows its first steps instead of empty panels.
 */
export function LabOverview({
  detail,
  overview,
  failed,
  helpers,
}: {
  detail: LabDetail;
  overview: LabOverviewAnswer | undefined;
  failed: boolean;
  helpers: OverviewHelpers;
}) {
  const slug = detail.lab.slug;
  return (
    <div className="grid gap-6">
      {overview ? (
        overview.empty ? (
          <FirstSteps slug={slug} steps={overview.firstSteps} />
        ) : (
          <AttentionList entries={attentionEntries(overview, slug, helpers.reasonLabel)} helpers={helpers} />
        )
      ) : failed ? (
        <Notice tone="alert">The overview could not be loaded; it is tried again every minute.</Notice>
      ) : (
        <LoadingNote what="Looking at what needs attention…" />
      )}
      <LabFacts detail={detail} />
      {overview && !overview.empty && <OverviewPanels o={overview} slug={slug} reasonLabel={helpers.reasonLabel} />}
      {overview && (
        <p className="text-xs text-ink-soft">
          As of <Instant at={overview.now} kind="account" />; refreshed every minute while this page is open.
        </p>
      )}
      <SectionLinks detail={detail} />
    </div>
  );
}
