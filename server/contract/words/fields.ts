import type { z } from 'zod';
import { humanizeKey } from './reasons.ts';
import { ALERT_LABELS, ALERT_RULE_LABELS } from './alerts.ts';
import { AUDIT_LABELS } from './audit.ts';
import { BILLING_LABELS } from './billing.ts';
import { RANGE_LABELS } from './channels.ts';
import { LAB_LABELS } from './labs.ts';
import { DIAGNOSTICS_FIELD_LABELS } from './diagnostics.ts';
import { CHANNEL_LABELS, LOGGER_LABELS, TEST_READING_LABELS } from './loggers.ts';
import { ME_LABELS } from './me.ts';
import { MEMBER_LABELS } from './members.ts';
import { NOTE_LABELS } from './notes.ts';
import { DISCARD_REASON_LABEL, QUARANTINE_LABELS } from './quarantine.ts';
import { TOKEN_LABELS } from './tokens.ts';
import { UPLOAD_LABELS } from './uploads.ts';

/**
 * Field labels by route: which catalogue names the fields of a request, so an answer says
 * "Lowest valid value: must be below …" instead of `validMin`. Pure, so the client may import it.
 */

/** One refused field of a request: its key path (for programs and form placement), its label and the reason (for people). */
export interface FieldProblem {
  /** The field's key path as sent, dotted (`validMax`, `channels.2.key`, `params.low`); '' for the request as a whole. */
  field: string;
  /** The field as the form names it ("Highest valid value"). */
  label: string;
  /** Why it was refused, in plain words ("must be above the lowest valid value"). */
  reason: string;
}

type Labels = Readonly<Record<string, string>>;

/** Every key of `labels` also under `parent.` (a logger's channels, a bulk repair's filter). */
function under(parent: string, labels: Labels): Labels {
  return Object.fromEntries(Object.entries(labels).map(([k, v]) => [`${parent}.${k}`, v]));
}

const LOGGER_FIELDS: Labels = { ...LOGGER_LABELS, ...under('channels', CHANNEL_LABELS) };
const QUARANTINE_FIELDS: Labels = { ...QUARANTINE_LABELS, 'action.reason': DISCARD_REASON_LABEL, 'rows.channel': 'Channel', 'rows.id': 'Which row' };

/** The catalogue for a route path (the lab-relative path of the route table, or an absolute one); first match wins. */
const BY_ROUTE: Array<[RegExp, Labels]> = [
  [/^\/loggers\/:loggerId\/uploads/, { ...UPLOAD_LABELS, ...LOGGER_LABELS }],
  [/^\/loggers\/:loggerId\/test-reading/, { ...RANGE_LABELS, ...TEST_READING_LABELS, loggerId: LOGGER_LABELS.loggerId }],
  [/^\/(loggers|channels)\/:\w+\/notes/, { ...RANGE_LABELS, ...NOTE_LABELS }],
  [/^\/loggers\/:loggerId\/channels/, { ...CHANNEL_LABELS, loggerId: LOGGER_LABELS.loggerId }],
  [/^\/loggers/, LOGGER_FIELDS],
  [/^\/channels\/:channelId\/(diagnostics|comparison)/, DIAGNOSTICS_FIELD_LABELS],
  [/^\/channels\/:channelId\/alerts/, { ...RANGE_LABELS, ...ALERT_LABELS }],
  [/^\/channels/, RANGE_LABELS],
  [/^\/alert-rules/, ALERT_RULE_LABELS],
  [/^\/alerts/, ALERT_LABELS],
  [/^\/note-kinds/, { ...NOTE_LABELS, name: NOTE_LABELS.name, kindId: NOTE_LABELS.kindId }],
  [/^\/notes/, { ...RANGE_LABELS, ...NOTE_LABELS }],
  [/^\/quarantine/, QUARANTINE_FIELDS],
  [/^\/(members|invitations|membership)|^\/api\/v1\/invitations/, MEMBER_LABELS],
  [/^\/tokens/, TOKEN_LABELS],
  [/^\/billing/, BILLING_LABELS],
  [/^\/audit/, AUDIT_LABELS],
  [/^\/api\/v1\/me/, ME_LABELS],
  [/^(\/deletion|\/api\/v1\/labs|)$/, LAB_LABELS],
];

/** Every catalogue at once, for a field named without its route (later areas do not override earlier ones). */
const ANY_ROUTE: Labels = Object.assign({}, ...BY_ROUTE.map(([, labels]) => labels).reverse()) as Labels;

/** What one item of a list field is called ("Channel key (3rd channel)"). */
const ITEM_WORDS: Labels = { channels: 'channel', rows: 'row', ids: 'row', samples: 'time text' };

/** 1st, 2nd, 3rd, 4th … 11th, 12th, 13th, 21st (English ordinals). */
export function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th');
  return `${n.toLocaleString('en-GB')}${suffix}`;
}

/**
 * The label of a field by its key path: the route's catalogue (`parent.key` before `key`), then
 * any catalogue, then the key in words; list positions are named ("(3rd channel)", counting from 1).
 */
export function fieldLabel(path: readonly PropertyKey[], routePath?: string): string {
  const labels = (routePath !== undefined && BY_ROUTE.find(([re]) => re.test(routePath))?.[1]) || ANY_ROUTE;
  const keys = path.filter((p): p is string => typeof p === 'string');
  const positions = path.flatMap((p, i) => (typeof p === 'number' ? [{ list: String(path[i - 1] ?? ''), n: p + 1 }] : []));
  const leaf = keys.at(-1);
  const pair = keys.slice(-2).join('.');
  let label = leaf === undefined ? 'The request' : (labels[pair] ?? labels[leaf] ?? ANY_ROUTE[pair] ?? ANY_ROUTE[leaf] ?? capitalise(humanizeKey(leaf)));
  const where = positions.map(({ list, n }) => `${ordinal(n)} ${ITEM_WORDS[list] ?? 'item'}`).join(', ');
  if (where) label += ` (${where})`;
  return label;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** `Label: reason.` lines joined into one message for people. */
export function problemsMessage(problems: readonly Pick<FieldProblem, 'label' | 'reason'>[]): string {
  return problems.map((p) => `${p.label}: ${p.reason.replace(/[.\s]+$/, '')}.`).join(' ');
}

/**
 * The refused fields of a failed parse, each with its label and plain reason. A field that is
 * not in the schema (a strict object) is listed under its own key.
 */
export function problemsOfIssues(issues: readonly z.core.$ZodIssue[], routePath?: string): FieldProblem[] {
  return issues.flatMap((issue): FieldProblem[] => {
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => {
        const path = [...issue.path, key];
        return { field: path.map(String).join('.'), label: fieldLabel(path, routePath), reason: 'is not a field of this form' };
      });
    }
    return [{ field: issue.path.map(String).join('.'), label: fieldLabel(issue.path, routePath), reason: issue.message }];
  });
}
