import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { useAcknowledgeAlert } from '../api/acknowledge-alert.ts';
import type { Alert } from '@shared/contract/alerts.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import { STAGE_WORDS } from './early-warning-words.ts';
import { ProjectionSummary } from './projection-summary.tsx';

/** Acknowledge with a note: someone is on it, so reminders stop. */
function AcknowledgeForm({ slug, alert }: { slug: string; alert: Alert }) {
  const ack = useAcknowledgeAlert(slug, alert.id);
  const [note, setNote] = useState('');
  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    await ack.mutateAsync(note).catch(() => undefined);
  }
  return (
    <form aria-label={`Acknowledge ${alert.ruleName}`} onSubmit={onSubmit} className="flex flex-wrap items-end gap-2">
      <TextField label="Note" placeholder="e.g. door closed, checking" value={note} maxLength={500} onChange={(e) => setNote(e.target.value)} />
      <Button type="submit" size="sm" disabled={ack.isPending}>
        Acknowledge
      </Button>
      {ack.isError && <Notice tone="alert">{ack.error.message}</Notice>}
    </form>
  );
}

/** Alerts, newest first: what opened each, when, whether it resolved, and who acknowledged it. */
export function AlertsList({
  slug,
  alerts,
  channelHref,
  canAcknowledge,
  label,
  zoneOf,
  unitOf,
}: {
  slug: string;
  alerts: Alert[];
  channelHref: (a: Alert) => string | null;
  canAcknowledge: boolean;
  label: string;
  /** The IANA zone of the alert's logger, so its times show on the logger's clock (by default). */
  zoneOf?: (a: Alert) => string | null | undefined;
  /** The unit of the alert's channel, for the early warning's numbers ('' when unknown). */
  unitOf?: (a: Alert) => string | null | undefined;
}) {
  if (alerts.length === 0) return <p className="text-sm text-ink-soft">None.</p>;
  return (
    <ul aria-label={label} className="grid gap-3">
      {alerts.map((a) => {
        const href = channelHref(a);
        // an early warning is told apart in words and by its dashed outline, not by colour alone
        const expected = a.stage === 'expected';
        return (
          <li
            key={a.id}
            data-stage={a.stage}
            className={`grid gap-1 rounded-lg border p-3 ${expected ? 'border-dashed border-2' : ''} ${a.open ? (expected ? 'border-amber' : 'border-alert') : 'border-rule'}`}
          >
            <p className="font-medium">
              {a.open ? 'Open' : 'Resolved'}: {a.ruleName}{' '}
              <span className="ml-1 rounded border border-current px-1 text-xs uppercase tracking-wide">{STAGE_WORDS[a.stage]}</span>
              {href && (
                <Link to={href} className="ml-2 text-sm text-lichen-dark underline underline-offset-2">
                  see the channel then
                </Link>
              )}
            </p>
            <p className="text-sm">
              Opened <Instant at={a.openedAt} kind="readings" loggerZone={zoneOf?.(a)} />: {a.openedDetail}.
              {a.resolvedAt !== null && (
                <>
                  {' Resolved '}
                  <Instant at={a.resolvedAt} kind="readings" loggerZone={zoneOf?.(a)} />: {a.resolvedDetail ?? ''}.
                </>
              )}
              {a.remindersSent > 0 && ` Reminders sent: ${a.remindersSent}.`}
            </p>
            {expected && a.projection && <ProjectionSummary projection={a.projection} unit={unitOf?.(a) ?? ''} />}
            {a.acknowledged ? (
              <p className="text-sm text-ink-soft">
                Acknowledged by {a.acknowledged.by?.name ?? 'someone'}
                {a.acknowledged.note ? `: “${a.acknowledged.note}”` : ''}
              </p>
            ) : (
              canAcknowledge && a.open && <AcknowledgeForm slug={slug} alert={a} />
            )}
          </li>
        );
      })}
    </ul>
  );
}
