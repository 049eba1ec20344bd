import type { ReactNode } from 'react';
import { Instant } from '../../../components/clock/instant.tsx';
import type { LoggerDetail } from '@shared/contract/loggers.ts';
import { formatInterval } from './format-interval.ts';

/** A logger's details as a description list: serial, site, zone, interval, registration, last reading, retirement. */
export function LoggerDetails({ logger }: { logger: LoggerDetail }) {
  const rows: Array<[string, ReactNode]> = [
    ['Serial number', logger.serial ?? '—'],
    ['Site', logger.site ?? '—'],
    ['Time zone', logger.timezone],
    ['Expected interval', `${formatInterval(logger.expectedIntervalS)} (${logger.expectedIntervalS} s)`],
    ['Registered', <Instant key="c" at={logger.createdAt} kind="account" />],
    ['Last seen', <Instant key="s" at={logger.lastSeenAt} kind="readings" loggerZone={logger.timezone} relative />],
  ];
  if (logger.retiredAt) rows.push(['Retired', <Instant key="r" at={logger.retiredAt} kind="account" />]);
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 rounded-xl border border-rule bg-card p-5 text-sm">
      {rows.map(([term, value]) => (
        <div key={term} className="contents">
          <dt className="text-ink-soft">{term}</dt>
          <dd>{value}</dd>
        </div>
      ))}
    </dl>
  );
}
