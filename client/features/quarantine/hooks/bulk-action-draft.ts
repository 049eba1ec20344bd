import { bulkActionSchema, type BulkAction, type BulkActionKind } from '@shared/contract/quarantine.ts';
import type { UploadTimeFormat } from '@shared/contract/uploads.ts';
import { fieldLabel, problemsMessage } from '@shared/contract/words/fields.ts';
import { BULK_DRAFT_MESSAGES } from '../messages.ts';

/** The bulk repair form as the person fills it in (text fields as typed). */
export interface BulkActionDraft {
  kind: BulkActionKind;
  timeFormat: UploadTimeFormat;
  timePattern: string;
  /** '' = each row's logger's own zone. */
  timeZone: string;
  /** Shift: later (+) or earlier (−). */
  sign: '+' | '-';
  hours: string;
  minutes: string;
  /** '' until a channel is chosen. */
  channelId: string;
  reason: string;
}

export const EMPTY_DRAFT: BulkActionDraft = {
  kind: 'reread',
  timeFormat: 'day-first-dot',
  timePattern: '',
  timeZone: '',
  sign: '-',
  hours: '1',
  minutes: '0',
  channelId: '',
  reason: '',
};

const whole = (text: string) => (/^\s*\d{1,6}\s*$/.test(text) ? Number(text) : NaN);

/**
 * The draft as the API's action, checked with the server's own schema, or the first problem
 * as "Label: reason." (the words the server would use), so the form says it before asking.
 */
export function bulkActionFromDraft(d: BulkActionDraft): { action: BulkAction } | { error: string } {
  let candidate: unknown;
  switch (d.kind) {
    case 'reread':
      candidate = {
        kind: 'reread',
        timeFormat: d.timeFormat,
        ...(d.timeFormat === 'pattern' ? { timePattern: d.timePattern } : {}),
        ...(d.timeZone ? { timeZone: d.timeZone } : {}),
      };
      break;
    case 'shift': {
      const hours = whole(d.hours || '0');
      const minutes = whole(d.minutes || '0');
      if (Number.isNaN(hours)) return { error: BULK_DRAFT_MESSAGES.hoursWhole };
      if (Number.isNaN(minutes) || minutes > 59) return { error: BULK_DRAFT_MESSAGES.minutesWhole };
      candidate = { kind: 'shift', offsetMinutes: (d.sign === '-' ? -1 : 1) * (hours * 60 + minutes) };
      break;
    }
    case 'map-channel':
      if (!d.channelId) return { error: BULK_DRAFT_MESSAGES.chooseChannel };
      candidate = { kind: 'map-channel', channelId: Number(d.channelId) };
      break;
    case 'discard':
      candidate = { kind: 'discard', reason: d.reason };
      break;
  }
  const parsed = bulkActionSchema.safeParse(candidate);
  if (parsed.success) return { action: parsed.data };
  const issue = parsed.error.issues[0];
  // the field's label as the server names it within a repair (`action.reason` is "Why they are discarded")
  return { error: problemsMessage([{ label: fieldLabel(['action', ...issue.path], '/quarantine'), reason: issue.message }]) };
}

/** A signed offset in minutes as people say it: "+1 h 30 min", "−45 min". */
export function offsetText(minutes: number): string {
  const sign = minutes < 0 ? '−' : '+';
  const abs = Math.abs(minutes);
  const h = Math.floor(abs / 60);
  const m = abs % 60;
  return `${sign}${h ? `${h} h` : ''}${h && m ? ' ' : ''}${m || !h ? `${m} min` : ''}`;
}
