import type { ChannelDetail, ChannelOverview } from '../../services/channels.service.ts';
import type { ChannelWithState } from '../../db/channel-state.repo.ts';
import { presentChannel } from '../presenters/loggers.presenter.ts';

const isoOrNull = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

function presentChannelCore(c: ChannelWithState & { status: string; intervalS: number }) {
  return {
    ...presentChannel(c),
    logger: { id: c.logger.id, name: c.logger.name, site: c.logger.site, timezone: c.logger.timezone, expectedIntervalS: c.logger.expectedIntervalS },
    status: c.status,
    statusIntervalS: c.intervalS,
    lastReading: c.lastReadingTs === null ? null : { ts: c.lastReadingTs, time: isoOrNull(c.lastReadingTs), value: c.lastReadingValue },
    dataVersion: c.dataVersion,
  };
}

/** One row of the channels overview. */
export function presentChannelOverview(c: ChannelOverview) {
  return { ...presentChannelCore(c), sparkline: { startHour: c.sparkline.startHour, stepS: 3600, means: c.sparkline.means } };
}

/** One channel with its logger and reading extent. */
export function presentChannelDetail(c: ChannelDetail) {
  return {
    ...presentChannelCore(c),
    firstReading: c.firstReadingTs === null ? null : { ts: c.firstReadingTs, time: isoOrNull(c.firstReadingTs) },
    readingCount: c.readingCount,
  };
}
