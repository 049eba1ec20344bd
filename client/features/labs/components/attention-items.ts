import type { LabOverviewAnswer, OverviewChannel, PlanMeasure } from '@shared/contract/overview.ts';
import { paths } from '../../../app/paths.ts';

/** What an attention entry is about, most urgent first (the order of the list). */
export const ATTENTION_ORDER = ['open-alerts', 'out-of-range', 'silent', 'quarantine', 'unused-key', 'no-key', 'plan'] as const;
export type AttentionKind = (typeof ATTENTION_ORDER)[number];

/** One line of the attention list: what, in a few plain words, and where it is dealt with. */
export interface AttentionEntry {
  /** Stable React key. */
  key: string;
  kind: AttentionKind;
  title: string;
  detail: string;
  href: string;
  /** The channel the entry is about, so the page can add the safety caution where one applies. */
  channel?: OverviewChannel;
}

/** How the page names a quarantine reason code (the quarantine page's own labels, handed in by the route). */
export type ReasonLabel = (reason: string) => string;

const MEASURE_WORDS: Record<PlanMeasure, string> = {
  readings: 'stored readings',
  loggers: 'active loggers',
  members: 'members and pending invitations',
  quarantinedRows: 'rows in quarantine',
};

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en')} ${n === 1 ? one : many}`;

/** A channel's value with its unit ("24.1 °C"). */
export function valueText(c: OverviewChannel): string {
  if (!c.lastReading) return 'no reading yet';
  return `${c.lastReading.value.toLocaleString('en', { maximumFractionDigits: 4 })}${c.unit ? ` ${c.unit}` : ''}`;
}

/** The valid range in words ("0 to 30 °C", "at most 30 °C"). */
export function rangeText(c: OverviewChannel): string {
  const unit = c.unit ? ` ${c.unit}` : '';
  if (c.validMin !== null && c.validMax !== null) return `${c.validMin} to ${c.validMax}${unit}`;
  if (c.validMax !== null) return `at most ${c.validMax}${unit}`;
  return `at least ${c.validMin}${unit}`;
}

/** A duration in the largest whole unit ("3 hours", "2 days"). */
export function durationText(ms: number): string {
  const minutes = Math.max(1, Math.floor(ms / 60_000));
  if (minutes < 120) return plural(minutes, 'minute');
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return plural(hours, 'hour');
  return plural(Math.floor(hours / 24), 'day');
}

/**
 * The attention list of a lab's overview, most urgent first: open alerts, channels out of range,
 * silent channels, quarantined rows by reason, loggers whose key was never used or that have no
 * key, and plan limits at 80% or more. Each entry links to the page where it is dealt with
 * (alerts page, channel page, quarantine filtered by reason, logger page, billing). Parts the
 * role may not see are absent from the answer, so they add nothing here.
 */
export function attentionEntries(o: LabOverviewAnswer, slug: string, reasonLabel: ReasonLabel): AttentionEntry[] {
  const nowMs = Date.parse(o.now);
  const entries: AttentionEntry[] = [];
  if (o.alerts && o.alerts.openCount > 0) {
    const newest = o.alerts.recent[0];
    entries.push({
      key: 'alerts',
      kind: 'open-alerts',
      title: `${plural(o.alerts.openCount, 'open alert')}`,
      detail: newest ? `Newest: ${newest.ruleName}${newest.channel ? ` on ${newest.channel.label}` : ''}.` : 'See the alerts page.',
      href: paths.labAlerts.href(slug),
    });
  }
  for (const c of o.channels?.outOfRange ?? []) {
    entries.push({
      key: `range-${c.id}`,
      kind: 'out-of-range',
      title: `${c.label} is out of range`,
      detail: `Last value ${valueText(c)} on ${c.logger.name}; valid is ${rangeText(c)}.`,
      href: paths.labChannel.href(slug, c.id),
      channel: c,
    });
  }
  for (const c of o.channels?.silent ?? []) {
    const quiet = c.lastReading ? durationText(nowMs - Date.parse(c.lastReading.time)) : null;
    entries.push({
      key: `silent-${c.id}`,
      kind: 'silent',
      title: `${c.label} is silent`,
      detail: `No reading from ${c.logger.name} for ${quiet}; one is expected every ${durationText(c.intervalS * 1000)}.`,
      href: paths.labChannel.href(slug, c.id),
      channel: c,
    });
  }
  for (const r of o.quarantine?.byReason ?? []) {
    entries.push({
      key: `quarantine-${r.reason}`,
      kind: 'quarantine',
      title: `${r.atLeast ? `${r.count.toLocaleString('en')} or more rows` : plural(r.count, 'row')} waiting in quarantine`,
      detail: `Reason: ${reasonLabel(r.reason)}.`,
      href: paths.labQuarantine.href(slug, new URLSearchParams({ reason: r.reason }).toString()),
    });
  }
  for (const k of o.keys?.neverUsed ?? []) {
    entries.push({
      key: `unused-${k.logger.id}`,
      kind: 'unused-key',
      title: `${k.logger.name} has not used its key`,
      detail: 'No reading has come in with it yet: check the logger’s setup.',
      href: paths.labLogger.href(slug, k.logger.id),
    });
  }
  for (const k of o.keys?.withoutKey ?? []) {
    entries.push({
      key: `nokey-${k.logger.id}`,
      kind: 'no-key',
      title: `${k.logger.name} has no key`,
      detail: 'It cannot send readings until it is given one.',
      href: paths.labLogger.href(slug, k.logger.id),
    });
  }
  for (const u of o.plan?.usage ?? []) {
    if (u.level === 0) continue;
    entries.push({
      key: `plan-${u.measure}`,
      kind: 'plan',
      title: u.level === 100 ? `Plan limit reached: ${MEASURE_WORDS[u.measure]}` : `Near the plan’s limit: ${MEASURE_WORDS[u.measure]}`,
      detail: `${u.used.toLocaleString('en')} of ${u.allowed.toLocaleString('en')} on the ${o.plan!.planName} plan.`,
      href: paths.labBilling.href(slug),
    });
  }
  return entries.sort((a, b) => ATTENTION_ORDER.indexOf(a.kind) - ATTENTION_ORDER.indexOf(b.kind));
}
