import type { IsoTime } from './common.ts';

/**
 * What a lab's admins see of retention (issue #20 item 3): whether the lab's plan ever removes
 * readings from storage and, if it does, which and when. Shared by the route
 * (`GET /api/v1/labs/:lab/billing/retention`) and the billing page.
 */

/** The plan keeps every reading, however old (every plan shipped today). */
export interface RetentionKeepsEverything {
  removes: false;
  planName: string;
  /** Days back the plan shows; older readings stay stored and show again with a longer plan. */
  historyDays: number;
  /** One sentence for people reading the answer directly (no times in it). */
  sentence: string;
}

/** The plan removes readings once they are past its history plus the export days. */
export interface RetentionRemoves {
  removes: true;
  planName: string;
  historyDays: number;
  /** Days readings stay stored after leaving the history, for exporting them. */
  exportDays: number;
  /** Readings before this instant (a UTC day start) are removed at the next removal; none after it. */
  horizon: IsoTime;
  /** The lab's oldest stored reading, or null when it stores none. */
  oldestReading: IsoTime | null;
  /** Readings stored before the horizon now (counted from the day summaries; exact to the reading). */
  readingsBeforeHorizon: number;
  /** When the next removal runs (the job runs once a day). */
  nextRemovalAt: IsoTime;
  sentence: string;
}

/** `GET …/billing/retention`. */
export type RetentionAnswer = RetentionKeepsEverything | RetentionRemoves;
