import type { LoggerSummary } from '@shared/contract/loggers.ts';

/** A logger's state at a glance, worst first. */
export type LoggerStatus = 'silent' | 'not-heard' | 'reporting' | 'retired';
export const LOGGER_STATUS_ORDER: readonly LoggerStatus[] = ['silent', 'not-heard', 'reporting', 'retired'];

const LOOKS: Record<LoggerStatus, { label: string; meaning: string; tone: string }> = {
  reporting: { label: 'Reporting', meaning: 'heard from within 3 × its expected interval', tone: 'text-lichen-dark border-lichen/40 bg-lichen/10' },
  silent: { label: 'Silent', meaning: 'nothing heard for more than 3 × its expected interval', tone: 'text-alert border-alert/40 bg-alert/5' },
  'not-heard': { label: 'Not heard from yet', meaning: 'no reading has arrived since it was registered', tone: 'text-ink-soft border-rule bg-card' },
  retired: { label: 'Retired', meaning: 'taken out of use; its readings are kept', tone: 'text-ink-soft border-rule bg-paper' },
};

/**
 * A logger's status from its summary: retired, never heard from, silent (nothing for more
 * than 3 × the expected interval — the same rule the channels' "silent" status uses) or
 * reporting. `now` is epoch ms.
 */
export function loggerStatus(logger: Pick<LoggerSummary, 'retiredAt' | 'lastSeenAt' | 'expectedIntervalS'>, now: number): LoggerStatus {
  if (logger.retiredAt) return 'retired';
  if (!logger.lastSeenAt) return 'not-heard';
  return now - Date.parse(logger.lastSeenAt) > 3 * logger.expectedIntervalS * 1000 ? 'silent' : 'reporting';
}

/** The status as a small labelled badge (text, so colour is never the only cue), its meaning in the title. */
export function LoggerStatusBadge({ status }: { status: LoggerStatus }) {
  const look = LOOKS[status];
  return (
    <span
      data-logger-status={status}
      title={look.meaning}
      className={`inline-block whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-medium ${look.tone}`}
    >
      {look.label}
    </span>
  );
}
