import { useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths.ts';
import { Button, buttonClasses } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { LoggerDetail } from '@shared/contract/loggers.ts';
import { ChannelsTable } from './channels-table.tsx';
import { KeysPanel } from './keys-panel.tsx';
import { LoggerDetails } from './logger-details.tsx';
import { LoggerEditForm } from './logger-edit-form.tsx';
import { RetireLoggerButton } from './retire-logger-button.tsx';
import { SetupGuidePanel } from './setup-guide-panel.tsx';
import { LOGGER_NOTICES } from '../messages.ts';

/** What the signed-in member may do on a logger's page (from the lab's permission list). */
export interface LoggerPageRights {
  manage: boolean;
  keys: boolean;
  upload: boolean;
  quarantine: boolean;
}

/**
 * A logger's page: details (editable), channels (add, edit, retire), ingest keys (issue,
 * rotate, revoke), historical upload, the set-up guide (with a test reading), and retirement. Each part
 * that changes something appears only for a role that may do it; others see it read-only.
 * A retired logger is read-only for everyone.
 */
export function LoggerPage({ slug, logger, rights, notes }: { slug: string; logger: LoggerDetail; rights: LoggerPageRights; notes?: ReactNode }) {
  const [editing, setEditing] = useState(false);
  const retired = logger.retiredAt !== null;
  const manage = rights.manage && !retired;
  const activeChannels = logger.channels.filter((c) => !c.retiredAt);
  const firstChannel = activeChannels[0];

  return (
    <div className="grid gap-10">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <Link to={paths.labLoggers.href(slug)} className="text-sm text-lichen-dark underline-offset-2 hover:underline">
            ← All loggers
          </Link>
          <h2 className="text-2xl font-semibold">{logger.name}</h2>
        </div>
        <div className="flex flex-wrap gap-2">
          {rights.upload && !retired && (
            <Link to={paths.labLoggerUpload.href(slug, logger.id)} className={buttonClasses('primary')}>
              Upload historical data
            </Link>
          )}
          {rights.quarantine && (
            <Link to={paths.labQuarantine.href(slug, `loggerId=${logger.id}`)} className={buttonClasses('secondary')}>
              Quarantined rows
            </Link>
          )}
        </div>
      </header>
      {retired && <Notice tone="status">{LOGGER_NOTICES.retired}</Notice>}

      <section aria-labelledby="logger-details-heading" className="grid gap-3">
        <div className="flex items-center justify-between gap-3">
          <h3 id="logger-details-heading" className="text-xl font-semibold">
            Details
          </h3>
          {manage && !editing && (
            <Button size="sm" onClick={() => setEditing(true)}>
              Edit details
            </Button>
          )}
        </div>
        {editing && manage ? <LoggerEditForm slug={slug} logger={logger} onDone={() => setEditing(false)} /> : <LoggerDetails logger={logger} />}
      </section>

      <section aria-labelledby="logger-channels-heading" className="grid gap-3">
        <h3 id="logger-channels-heading" className="text-xl font-semibold">
          Channels
        </h3>
        <ChannelsTable slug={slug} loggerId={logger.id} channels={logger.channels} canManage={manage} />
      </section>

      {/* the logger's notes (composed by the route: another feature) */}
      {notes}

      {rights.keys && logger.keys && (
        <section aria-labelledby="logger-keys-heading" className="grid gap-3">
          <h3 id="logger-keys-heading" className="text-xl font-semibold">
            Ingest keys
          </h3>
          {retired ? (
            <p className="text-sm text-ink-soft">A retired logger's keys no longer work.</p>
          ) : (
            <KeysPanel slug={slug} loggerId={logger.id} keys={logger.keys} exampleChannel={firstChannel} />
          )}
        </section>
      )}

      {!retired && activeChannels.length > 0 && (
        <section aria-labelledby="logger-setup-heading" className="grid gap-3">
          <h3 id="logger-setup-heading" className="text-xl font-semibold">
            Set up this logger
          </h3>
          <SetupGuidePanel
            slug={slug}
            loggerId={logger.id}
            timezone={logger.timezone}
            channels={activeChannels}
            origin={window.location.origin}
            canSendTest={manage}
          />
        </section>
      )}

      {manage && (
        <section aria-labelledby="logger-retire-heading" className="grid gap-2 border-t border-rule pt-6">
          <h3 id="logger-retire-heading" className="text-lg font-semibold">
            Retire this logger
          </h3>
          <p className="text-sm text-ink-soft">For a logger taken out of service. Its readings stay available for analysis.</p>
          <RetireLoggerButton slug={slug} loggerId={logger.id} name={logger.name} />
        </section>
      )}
    </div>
  );
}
