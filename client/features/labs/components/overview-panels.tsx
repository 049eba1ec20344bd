import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { LabOverviewAnswer, OverviewPlan, PlanMeasure } from '@shared/contract/overview.ts';
import { paths } from '../../../app/paths.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import type { ReasonLabel } from './attention-items.ts';

function Panel({ title, link, children }: { title: string; link?: { to: string; label: string }; children: ReactNode }) {
  return (
    <section className="min-w-0 rounded-xl border border-rule bg-card p-4 text-sm">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">{title}</h3>
        {link && (
          <Link to={link.to} className="text-lichen-dark underline">
            {link.label}
          </Link>
        )}
      </div>
      {children}
    </section>
  );
}

const STATUS_WORDS = { live: 'reporting', silent: 'silent', 'out-of-range': 'out of range', 'no-data': 'never reported' } as const;
const MEASURE_LABELS: Record<PlanMeasure, string> = {
  readings: 'Stored readings',
  loggers: 'Active loggers',
  members: 'Members and invitations',
  quarantinedRows: 'Rows in quarantine',
};

/** One plan limit as a bar with its figures; the bar's fill is never the only cue (the words say it). */
function UsageBar({ u }: { u: OverviewPlan['usage'][number] }) {
  const share = u.allowed > 0 ? Math.min(1, u.used / u.allowed) : 1;
  const tone = u.level === 100 ? 'bg-alert' : u.level === 80 ? 'bg-amber' : 'bg-lichen';
  return (
    <li>
      <div className="flex flex-wrap justify-between gap-x-2">
        <span>{MEASURE_LABELS[u.measure]}</span>
        <span className="tabular-nums">
          {u.used.toLocaleString('en')} of {u.allowed.toLocaleString('en')}
          {u.level === 100 ? ' — full' : u.level === 80 ? ' — nearly full' : ''}
        </span>
      </div>
      <div className="mt-1 h-1.5 rounded bg-paper" aria-hidden="true">
        <div className={`h-1.5 rounded ${tone}`} style={{ width: `${Math.round(share * 100)}%` }} />
      </div>
    </li>
  );
}

/** The parts of a lab's overview below the attention list, each shown only when the answer carries it. */
export function OverviewPanels({ o, slug, reasonLabel }: { o: LabOverviewAnswer; slug: string; reasonLabel: ReasonLabel }) {
  const now = Date.parse(o.now);
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {o.channels && (
        <Panel title="Channels" link={{ to: paths.labChannels.href(slug), label: 'All channels' }}>
          <p>
            {o.channels.total.toLocaleString('en')} in use on {o.loggerCount.toLocaleString('en')} {o.loggerCount === 1 ? 'logger' : 'loggers'}.
          </p>
          <ul className="mt-1 text-ink-soft">
            {(Object.keys(STATUS_WORDS) as Array<keyof typeof STATUS_WORDS>)
              .filter((s) => o.channels!.counts[s] > 0)
              .map((s) => (
                <li key={s}>
                  {o.channels!.counts[s].toLocaleString('en')} {STATUS_WORDS[s]}
                </li>
              ))}
          </ul>
        </Panel>
      )}
      {o.alerts && (
        <Panel title="Open alerts" link={{ to: paths.labAlerts.href(slug), label: 'Alerts page' }}>
          {o.alerts.openCount === 0 ? (
            <p className="text-ink-soft">None open.</p>
          ) : (
            <ul className="grid gap-2">
              {o.alerts.recent.map((a) => (
                <li key={a.id}>
                  <span className="font-medium">{a.ruleName}</span>
                  {a.channel && (
                    <>
                      {' on '}
                      <Link to={paths.labChannel.href(slug, a.channel.id)} className="text-lichen-dark underline">
                        {a.channel.label}
                      </Link>
                    </>
                  )}
                  {a.acknowledged && <span className="text-ink-soft"> (acknowledged)</span>}
                  <span className="block text-ink-soft">{a.detail}</span>
                  <Instant at={a.openedAt} kind="readings" loggerZone={a.logger?.timezone} relative now={now} />
                </li>
              ))}
              {o.alerts.openCount > o.alerts.recent.length && <li className="text-ink-soft">and {o.alerts.openCount - o.alerts.recent.length} more</li>}
            </ul>
          )}
        </Panel>
      )}
      {o.quarantine && (
        <Panel title="Quarantine" link={{ to: paths.labQuarantine.href(slug), label: 'Review' }}>
          {o.quarantine.waiting === 0 ? (
            <p className="text-ink-soft">No rows waiting.</p>
          ) : (
            <>
              <p>{o.quarantine.waiting.toLocaleString('en')} rows waiting.</p>
              <ul className="mt-1">
                {o.quarantine.byReason.map((r) => (
                  <li key={r.reason}>
                    <Link to={paths.labQuarantine.href(slug, new URLSearchParams({ reason: r.reason }).toString())} className="text-lichen-dark underline">
                      {reasonLabel(r.reason)}
                    </Link>{' '}
                    <span className="text-ink-soft">
                      {r.count.toLocaleString('en')}
                      {r.atLeast ? ' or more' : ''}
                    </span>
                  </li>
                ))}
              </ul>
            </>
          )}
        </Panel>
      )}
      {o.keys && (
        <Panel title="Loggers and keys" link={{ to: paths.labLoggers.href(slug), label: 'Loggers' }}>
          {o.keys.neverUsedCount + o.keys.withoutKeyCount === 0 ? (
            <p className="text-ink-soft">Every logger has a key it has used.</p>
          ) : (
            <ul className="grid gap-1">
              {o.keys.neverUsed.map((k) => (
                <li key={`u${k.logger.id}`}>
                  <Link to={paths.labLogger.href(slug, k.logger.id)} className="text-lichen-dark underline">
                    {k.logger.name}
                  </Link>{' '}
                  <span className="text-ink-soft">key never used</span>
                </li>
              ))}
              {o.keys.withoutKey.map((k) => (
                <li key={`n${k.logger.id}`}>
                  <Link to={paths.labLogger.href(slug, k.logger.id)} className="text-lichen-dark underline">
                    {k.logger.name}
                  </Link>{' '}
                  <span className="text-ink-soft">no key</span>
                </li>
              ))}
            </ul>
          )}
        </Panel>
      )}
      {o.plan && (
        <Panel title={`Plan: ${o.plan.planName}`} link={{ to: paths.labBilling.href(slug), label: 'Billing' }}>
          {o.plan.ingestionRefused && <p className="mb-2 font-medium text-alert">Storage is full: loggers’ readings are being refused.</p>}
          <ul className="grid gap-2">
            {o.plan.usage.map((u) => (
              <UsageBar key={u.measure} u={u} />
            ))}
          </ul>
        </Panel>
      )}
      {o.lastUpload !== undefined && (
        <Panel title="Last upload">
          {o.lastUpload === null ? (
            <p className="text-ink-soft">No history file uploaded yet.</p>
          ) : (
            <div className="grid gap-1">
              <Instant at={o.lastUpload.at} kind="readings" loggerZone={o.lastUpload.logger?.timezone} relative now={now} />
              <p>
                {o.lastUpload.logger ? (
                  <Link to={paths.labLoggerUpload.href(slug, o.lastUpload.logger.id)} className="text-lichen-dark underline">
                    {o.lastUpload.logger.name}
                  </Link>
                ) : (
                  'A logger no longer in the lab'
                )}
                {o.lastUpload.by ? `, by ${o.lastUpload.by.name}` : ''}
              </p>
              <p className="text-ink-soft">
                {o.lastUpload.accepted.toLocaleString('en')} readings stored, {o.lastUpload.duplicates.toLocaleString('en')} already there,{' '}
                {o.lastUpload.quarantined.toLocaleString('en')} quarantined{o.lastUpload.stopped ? ' — the upload stopped early' : ''}.
              </p>
            </div>
          )}
        </Panel>
      )}
    </div>
  );
}
