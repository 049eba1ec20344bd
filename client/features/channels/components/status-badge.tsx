import type { ChannelStatus } from '@shared/contract/channels.ts';

interface StatusLook {
  label: string;
  /** What the status means, for the legend and the badge's title. */
  meaning: string;
  tone: string;
  /** Drawn in a 12 × 12 box; each status has its own shape, so colour is never the only cue. */
  shape: 'disc' | 'ring' | 'triangle' | 'dash';
}

/** Lagbook's own status marks: a filled disc, an open ring, a warning triangle, a dash. */
export const STATUS_LOOKS: Record<ChannelStatus, StatusLook> = {
  live: {
    label: 'Live',
    meaning: 'readings arrive as expected and the last value lies in the valid range',
    tone: 'text-lichen-dark border-lichen/40 bg-lichen/10',
    shape: 'disc',
  },
  silent: {
    label: 'Silent',
    meaning: 'no reading for more than 3 × the expected interval',
    tone: 'text-ink-soft border-ink-soft/40 bg-paper',
    shape: 'ring',
  },
  'out-of-range': {
    label: 'Out of range',
    meaning: 'the last value lies outside the channel’s valid minimum–maximum',
    tone: 'text-alert border-alert/40 bg-alert/5',
    shape: 'triangle',
  },
  'no-data': { label: 'No data', meaning: 'the channel has never received a reading', tone: 'text-ink-soft border-rule bg-card', shape: 'dash' },
};

function StatusShape({ shape }: { shape: StatusLook['shape'] }) {
  return (
    <svg viewBox="0 0 12 12" width="12" height="12" aria-hidden="true" className="shrink-0">
      {shape === 'disc' && <circle cx="6" cy="6" r="5" fill="currentColor" />}
      {shape === 'ring' && <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.8" />}
      {shape === 'triangle' && <path d="M6 1 L11.2 10.6 H0.8 Z" fill="currentColor" />}
      {shape === 'dash' && <rect x="1" y="5" width="10" height="2" fill="currentColor" />}
    </svg>
  );
}

/** A channel's status as a small pill: shape, colour and word together. */
export function StatusBadge({ status }: { status: ChannelStatus }) {
  const look = STATUS_LOOKS[status];
  return (
    <span
      title={look.meaning}
      data-status={status}
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-md border px-2 py-0.5 text-xs font-medium ${look.tone}`}
    >
      <StatusShape shape={look.shape} />
      {look.label}
    </span>
  );
}

/** What each status mark means, shown under the channels table. */
export function StatusLegend() {
  return (
    <dl aria-label="Status marks" className="grid gap-1.5 text-sm sm:grid-cols-2">
      {(Object.keys(STATUS_LOOKS) as ChannelStatus[]).map((s) => (
        <div key={s} className="flex items-start gap-2">
          <dt>
            <StatusBadge status={s} />
          </dt>
          <dd className="text-ink-soft">{STATUS_LOOKS[s].meaning}</dd>
        </div>
      ))}
    </dl>
  );
}
