/**
 * Words of the quarantine area (the list, its filters, discard, re-submit and the bulk repairs):
 * field labels and the reasons its checks give. Shared by the contract, the quarantine services
 * and the client (`@shared/contract/words/quarantine.ts`).
 */

/** Fields of the quarantine filters, list, re-submit and bulk repairs. */
export const QUARANTINE_LABELS = {
  loggerId: 'Logger',
  reason: 'Reason',
  channel: 'Channel as received',
  source: 'Came in by',
  receivedFrom: 'Received from',
  receivedTo: 'Received until',
  cursor: 'Page',
  page: 'Page number',
  pageSize: 'Rows per page',
  ids: 'Chosen rows',
  rows: 'Rows',
  id: 'Row',
  ts: 'Time',
  value: 'Value',
  selection: 'Rows to repair',
  filter: 'Rows matching the filters',
  action: 'Repair',
  kind: 'Kind of repair',
  timeFormat: 'Layout of the times',
  timePattern: 'Pattern of the times',
  timeZone: 'Time zone of the times',
  offsetMinutes: 'Shift (minutes)',
  channelId: 'Channel to store them under',
  runId: 'Repair run',
} as const;

/** `action.reason` of a discard is the person's own words, not the filter's reason code. */
export const DISCARD_REASON_LABEL = 'Why they are discarded';

/** Reasons the quarantine area's own checks give. */
export const QUARANTINE_REASONS = {
  badCursor: 'is not a page of this list (open the list again from its first page)',
  noPageNumbers: 'pages are reached with the list\'s "more" link, not by number',
  chooseRows: 'choose at least one row',
  receivedToAfterFrom: 'must be after "Received from"',
  filterOrIds: 'choose rows either by the filters or one by one, not both',
  source: 'must be where rows came in: api, upload or resubmit',
  kind: 'must be re-read, shift, store under a channel, or discard',
  shiftNotZero: 'must not be 0 (a shift of nothing changes nothing)',
  shiftWhole: 'must be a whole number of minutes',
  shiftBack: 'must be at most ten years back',
  shiftAhead: 'must be at most ten years ahead',
  channelId: 'choose a channel',
  discardWhy: 'say why, in a few words',
  patternNeeded: 'give the pattern of the times, e.g. dd.MM.yyyy HH:mm',
} as const;

/** At most `n` rows in one request. */
export const atMostRows = (n: number) => `choose at most ${n.toLocaleString('en-GB')} rows at a time`;
