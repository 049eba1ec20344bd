import { createAlertRuleSchema, type AlertRuleKind, type CreateAlertRuleInput } from '@shared/contract/alerts.ts';
import { fieldLabel, problemsMessage } from '@shared/contract/words/fields.ts';
import { CHOOSE_CHANNEL_TO_WATCH } from '../messages.ts';
import { CHANCE_PERCENT_REASON, LOOK_AHEAD_REASON } from './early-warning-words.ts';

/** The rule form's fields as typed (text), before they become a request body. */
export interface RuleFormState {
  name: string;
  kind: AlertRuleKind;
  /** `channel:<id>` or `logger:<id>` (loggers only for silence). */
  target: string;
  low: string;
  high: string;
  holdS: string;
  /** A bounds rule's early warning: 'on' or 'off' (a box), the look-ahead in minutes and the chance in percent. */
  earlyWarning: 'on' | 'off';
  horizonMin: string;
  chancePct: string;
  factor: string;
  maxPerMinute: string;
  direction: 'rise' | 'fall' | 'either';
  periodH: string;
  k: string;
  historyCycles: string;
  reminderAfterMin: string;
}

export const EMPTY_RULE_FORM: RuleFormState = {
  name: '',
  kind: 'bounds',
  target: '',
  low: '',
  high: '',
  holdS: '300',
  earlyWarning: 'off',
  horizonMin: '60',
  chancePct: '80',
  factor: '3',
  maxPerMinute: '',
  direction: 'either',
  periodH: '24',
  k: '5',
  historyCycles: '3',
  reminderAfterMin: '',
};

/** A stored number as the form shows it ('' for none). */
const text = (v: unknown): string => (typeof v === 'number' && Number.isFinite(v) ? String(v) : '');

/** The early-warning fields of a stored bounds rule (off, with the defaults, when it has none). */
function earlyWarningFields(w: unknown): Pick<RuleFormState, 'earlyWarning' | 'horizonMin' | 'chancePct'> {
  if (!w || typeof w !== 'object') return { earlyWarning: 'off', horizonMin: EMPTY_RULE_FORM.horizonMin, chancePct: EMPTY_RULE_FORM.chancePct };
  const { horizonMin, chance } = w as { horizonMin?: unknown; chance?: unknown };
  return { earlyWarning: 'on', horizonMin: text(horizonMin), chancePct: typeof chance === 'number' ? String(Math.round(chance * 1000) / 10) : '' };
}

/** The form's fields for a rule as stored (the change form starts from these). */
export function formFromRule(rule: {
  name: string;
  kind: RuleFormState['kind'];
  channelId: number | null;
  loggerId: number | null;
  params: Record<string, unknown>;
  reminderAfterMin: number | null;
}): RuleFormState {
  const p = rule.params;
  const direction = p.direction === 'rise' || p.direction === 'fall' ? p.direction : 'either';
  return {
    ...EMPTY_RULE_FORM,
    name: rule.name,
    kind: rule.kind,
    target: rule.channelId !== null ? `channel:${rule.channelId}` : `logger:${rule.loggerId}`,
    ...(rule.kind === 'bounds' && { low: text(p.low), high: text(p.high), holdS: text(p.holdS), ...earlyWarningFields(p.earlyWarning) }),
    ...(rule.kind === 'silence' && { factor: text(p.factor) }),
    ...(rule.kind === 'rate' && { maxPerMinute: text(p.maxPerMinute), direction }),
    ...(rule.kind === 'unusual' && { periodH: text(p.periodH), k: text(p.k), historyCycles: text(p.historyCycles) }),
    reminderAfterMin: text(rule.reminderAfterMin),
  };
}

/** A typed number, or undefined for an empty field (NaN for text that is no number, so the schema names it). */
const num = (s: string): number | undefined => (s.trim() === '' ? undefined : Number(s));

/** The early warning the form asks for: null when the box is off; the chance typed in percent. */
function earlyWarningInput(f: RuleFormState): { horizonMin: number | undefined; chance: number | undefined } | null {
  if (f.earlyWarning !== 'on') return null;
  const pct = num(f.chancePct);
  return { horizonMin: num(f.horizonMin), chance: pct === undefined ? undefined : pct / 100 };
}

/** The request body the form's fields make (not yet checked). */
export function ruleInputFromForm(f: RuleFormState): Record<string, unknown> {
  const [what, id] = f.target.split(':');
  const target = what === 'logger' ? { loggerId: Number(id) } : what === 'channel' ? { channelId: Number(id) } : { channelId: undefined };
  const params =
    f.kind === 'bounds'
      ? { low: num(f.low) ?? null, high: num(f.high) ?? null, holdS: num(f.holdS) ?? 0, earlyWarning: earlyWarningInput(f) }
      : f.kind === 'silence'
        ? { factor: num(f.factor) }
        : f.kind === 'rate'
          ? { maxPerMinute: num(f.maxPerMinute), direction: f.direction }
          : { periodH: num(f.periodH), k: num(f.k), historyCycles: num(f.historyCycles) };
  return { name: f.name, kind: f.kind, ...target, params, reminderAfterMin: num(f.reminderAfterMin) ?? null };
}

/** The keys the rule forms show a field for; a refusal of any other key is said on the form, with its label. */
export const RULE_FORM_FIELDS = [
  'name',
  'kind',
  'channelId',
  'loggerId',
  'reminderAfterMin',
  'params.low',
  'params.high',
  'params.holdS',
  'params.earlyWarning.horizonMin',
  'params.earlyWarning.chance',
  'params.factor',
  'params.maxPerMinute',
  'params.direction',
  'params.periodH',
  'params.k',
  'params.historyCycles',
] as const;

/**
 * The early-warning boxes say their refusals in their own units: the chance box takes percent,
 * while the schema's reason speaks of the stored share ("must be at least 0.5").
 */
const EARLY_WARNING_REASONS: Record<string, string> = {
  'params.earlyWarning.horizonMin': LOOK_AHEAD_REASON,
  'params.earlyWarning.chance': CHANCE_PERCENT_REASON,
};

/**
 * Puts refusals (key path → plain reason) on the form's fields; one about a key the form has no
 * field for goes to `body` as "Label: reason." (labels from the shared alerts catalogue), so no
 * key ever reaches the screen.
 */
export function placeRuleErrors(problems: ReadonlyArray<{ path: readonly PropertyKey[]; reason: string }>): Record<string, string> {
  const errors: Record<string, string> = {};
  const rest: Array<{ label: string; reason: string }> = [];
  for (const { path, reason } of problems) {
    const key = path.map(String).join('.');
    if ((RULE_FORM_FIELDS as readonly string[]).includes(key)) errors[key] ??= EARLY_WARNING_REASONS[key] ?? reason;
    else rest.push({ label: fieldLabel(path, '/alert-rules'), reason });
  }
  if (rest.length > 0) errors.body = problemsMessage(rest);
  return errors;
}

/**
 * Checks the form: first that something to watch is chosen ("Choose the channel to watch", not a
 * type refusal of an empty id), then with the server's own schema: the valid body, or the plain
 * reasons per field (`params.high`, `channelId` …) as the server would word them.
 */
export function checkRuleForm(f: RuleFormState): { input: CreateAlertRuleInput } | { errors: Record<string, string> } {
  const result = createAlertRuleSchema.safeParse(ruleInputFromForm(f));
  const chosen = f.target !== '';
  if (result.success && chosen) return { input: result.data };
  const problems = (result.success ? [] : result.error.issues)
    .filter((issue) => chosen || (issue.path[0] !== 'channelId' && issue.path[0] !== 'loggerId'))
    .map((issue) => ({ path: issue.path, reason: issue.message }));
  if (!chosen) problems.unshift({ path: ['channelId'], reason: CHOOSE_CHANNEL_TO_WATCH });
  return { errors: placeRuleErrors(problems) };
}

/** Splits a server message of `field: reason; field: reason` into its fields (others under `body`). */
export function errorsFromServerMessage(message: string): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const part of message.split('; ')) {
    const m = /^([A-Za-z][\w.]*):\s*(.+)$/s.exec(part);
    if (m) errors[m[1]] ??= m[2];
    else errors.body = errors.body ? `${errors.body}; ${part}` : part;
  }
  return errors;
}
