import type { ReactNode } from 'react';
import { zoneCaption } from '../../../components/clock/format.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import type { ChannelDetail } from '@shared/contract/channels.ts';
import { ChannelValue } from './channel-value.tsx';
import { StatusBadge } from './status-badge.tsx';

function validRange(c: ChannelDetail): string {
  const u = c.unit ? ` ${c.unit}` : '';
  if (c.validMin === null && c.validMax === null) return 'not set';
  if (c.validMin === null) return `up to ${c.validMax}${u}`;
  if (c.validMax === null) return `from ${c.validMin}${u}`;
  return `${c.validMin} to ${c.validMax}${u}`;
}

/**
 * The channel page's header: label and key, status, and the facts a reader needs to read the
 * chart (logger, site, unit, valid range, the logger's time zone and its current UTC offset,
 * extent of the readings).
 */
export function ChannelHeader({ channel, now }: { channel: ChannelDetail; now: number }) {
  const tz = channel.logger.timezone;
  const facts: Array<[string, ReactNode]> = [
    ['Logger', channel.logger.name],
    ['Site', channel.logger.site ?? '—'],
    ['Unit', channel.unit ?? '—'],
    ['Valid range', validRange(channel)],
    ['Time zone', `${zoneCaption(now, tz)} now`],
    ['Last value', <ChannelValue key="v" value={channel.lastReading?.value} unit={channel.unit} />],
    [
      'Readings',
      <span key="n">
        {channel.readingCount.toLocaleString('en')}
        {channel.firstReading && (
          <>
            {' since '}
            <Instant at={channel.firstReading.ts} kind="readings" loggerZone={tz} />
          </>
        )}
      </span>,
    ],
  ];
  return (
    <header className="grid gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-2xl font-semibold">{channel.label}</h2>
        <span className="font-mono text-sm text-ink-soft">{channel.key}</span>
        <StatusBadge status={channel.status} />
      </div>
      <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2 lg:grid-cols-4">
        {facts.map(([term, value]) => (
          <div key={term} className="flex gap-2">
            <dt className="text-ink-soft">{term}</dt>
            <dd className="font-medium">{value}</dd>
          </div>
        ))}
      </dl>
    </header>
  );
}
