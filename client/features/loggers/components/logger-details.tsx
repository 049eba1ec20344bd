import type { ReactNode } from 'react';
import { DateTime } from '../../../components/date-time.tsx';
import { RelativeTime } from '../../../components/relative-time.tsx';
import type { LoggerDetail } from '@shared/contract/loggers.ts';
import { formatInterval } from './format-interval.ts';

/** A logger's details as a description list: serial, site, zone, interval, registration, last reading, retirement. */
export function LoggerDetails({ logger }: { logger: LoggerDetail }) {
  const rows: Array<[string, ReactNode]> = [
    ['Serial number', logger.serial ?? '—'],
    ['Site', logger.site ?? '—'],
    ['Time zone', logger.timezone],
    ['Expected interval', `${formatInterval(logger.expectedIntervalS)} (${logger.expectedIntervalS} s)`],
    ['Registered', <DateTime key="c" iso={logger.createdAt} />],
    ['Last seen', <RelativeTime key="s" iso={logger.lastSeenAt} />],
  ];
  if (logger.retiredAt) rows.push(['Retired', <DateTime key="r" iso={logger.retiredAt} />]);
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
