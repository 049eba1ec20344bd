import type { ChannelDetail as ChannelDetailAnswer, ChannelOverviewRow, ChannelState, ChannelStatus } from '../../contract/channels.ts';
import type { ChannelDetail, ChannelOverview } from '../../services/channels.service.ts';
import type { ChannelWithState } from '../../db/channel-state.repo.ts';
import { presentChannel } from '../presenters/loggers.presenter.ts';

function presentChannelCore(c: ChannelWithState & { status: ChannelStatus; intervalS: number }): ChannelState {
  return {
    ...presentChannel(c),
    logger: { id: c.logger.id, name: c.logger.name, site: c.logger.site, timezone: c.logger.timezone, expectedIntervalS: c.logger.expectedIntervalS },
    status: c.status,
    statusIntervalS: c.intervalS,
    // as the status reads it: no last reading until both its time and value are known
    lastReading:
      c.lastReadingTs === null || c.lastReadingValue === null
        ? null
        : { ts: c.lastReadingTs, time: new Date(c.lastReadingTs).toISOString(), value: c.lastReadingValue },
    dataVersion: c.dataVersion,
  };
}

/** One row of the channels overview. */
export function presentChannelOverview(c: ChannelOverview): ChannelOverviewRow {
  return { ...presentChannelCore(c), sparkline: { startHour: c.sparkline.startHour, stepS: 3600, means: c.sparkline.means } };
}

/** One channel with its logger and reading extent. */
export function presentChannelDetail(c: ChannelDetail): ChannelDetailAnswer {
  return {
    ...presentChannelCore(c),
    firstReading: c.firstReadingTs === null ? null : { ts: c.firstReadingTs, time: new Date(c.firstReadingTs).toISOString() },
    readingCount: c.readingCount,
  };
}
