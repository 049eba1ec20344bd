import type { IsoTime } from './common.ts';
import type { ChannelStatus } from './channels.ts';

/**
 * `GET /api/v1/labs/:lab/overview`: what in the lab needs attention, for the lab's home page.
 * Each part is present only when the caller's role may see it (a guest gets no quarantine, keys,
 * plan or upload part); each entry carries the ids the client links with. Shared with the client.
 */

/** At most this many entries of a list come back (the counts beside them say how many there are). */
export const OVERVIEW_LIST_LIMIT = 10;

/** A channel in an attention list: what the client needs to name it, link to it and judge its caution. */
export interface OverviewChannel {
  id: number;
  key: string;
  label: string;
  quantity: string | null;
  unit: string | null;
  logger: { id: number; name: string };
  /** The status decided by the channels page's one rule (channels.service.ts `channelStatus`). */
  status: ChannelStatus;
  /** Seconds between readings the status is judged by. */
  intervalS: number;
  lastReading: { time: IsoTime; value: number } | null;
  validMin: number | null;
  validMax: number | null;
}

/** The channels part (`channels.read`): channels in use, counted by status, and the silent and out-of-range ones. */
export interface OverviewChannels {
  total: number;
  counts: Record<ChannelStatus, number>;
  /** Longest silent first. */
  silent: OverviewChannel[];
  /** Most recent reading first. */
  outOfRange: OverviewChannel[];
}

/** One open alert, newest first. */
export interface OverviewAlert {
  id: number;
  ruleName: string;
  openedAt: IsoTime;
  detail: string;
  acknowledged: boolean;
  channel: { id: number; label: string } | null;
  /** The logger the alert is about, with its IANA zone (the clock its times are shown on by default). */
  logger: { id: number; name: string; timezone: string } | null;
}

/** The alerts part (`alerts.read`). */
export interface OverviewAlerts {
  openCount: number;
  recent: OverviewAlert[];
}

/** The quarantine part (`quarantine.review`): the kept count, and the reasons with their rows, each counted up to 1,000 (`atLeast` beyond), latest first. */
export interface OverviewQuarantine {
  waiting: number;
  byReason: Array<{ reason: string; count: number; atLeast: boolean; latestAt: IsoTime }>;
}

/** A logger in the keys part. */
export interface OverviewLoggerKey {
  logger: { id: number; name: string };
  /** When the key was issued (never-used list) or the logger was registered (no-key list). */
  since: IsoTime;
}

/** The keys part (`ingest-keys.manage`): loggers in use whose key was never used, and those with no working key. */
export interface OverviewKeys {
  neverUsed: OverviewLoggerKey[];
  neverUsedCount: number;
  withoutKey: OverviewLoggerKey[];
  withoutKeyCount: number;
}

/** What a plan limits, as the overview names it. */
export type PlanMeasure = 'readings' | 'loggers' | 'members' | 'quarantinedRows';

/** The plan part (`billing.manage`): what `GET …/billing` reports, per limit, with the warning level the usage mails use (0, 80, 100). */
export interface OverviewPlan {
  planName: string;
  ingestionRefused: boolean;
  usage: Array<{ measure: PlanMeasure; used: number; allowed: number; level: 0 | 80 | 100 }>;
}

/** The last finished upload of a history file (`uploads.create`), from the audit log. */
export interface OverviewUpload {
  at: IsoTime;
  /** The logger the file was for, with its IANA zone. */
  logger: { id: number; name: string; timezone: string } | null;
  by: { name: string } | null;
  lines: number;
  accepted: number;
  duplicates: number;
  quarantined: number;
  /** True when the import stopped before the end of the file (what was stored is kept). */
  stopped: boolean;
}

/** A first step for a lab without loggers; present only when the role may do it. */
export type FirstStep = 'register-logger' | 'invite-colleague' | 'upload-history';

/** `GET …/overview`. */
export interface LabOverviewAnswer {
  now: IsoTime;
  /** Loggers in use (not retired). */
  loggerCount: number;
  /** True when the lab has no logger in use: the page shows `firstSteps` instead of empty parts. */
  empty: boolean;
  /** The steps the caller's role may take, in order (empty unless `empty`). */
  firstSteps: FirstStep[];
  channels?: OverviewChannels;
  alerts?: OverviewAlerts;
  quarantine?: OverviewQuarantine;
  keys?: OverviewKeys;
  plan?: OverviewPlan;
  /** Null when no upload was recorded yet. */
  lastUpload?: OverviewUpload | null;
}
