import { useParams } from 'react-router-dom';
import { LoggerLoader } from '../../features/loggers/components/logger-loader.tsx';
import { LoggerPage } from '../../features/loggers/components/logger-page.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { LoggerNotesPanel } from '../../features/notes/components/logger-notes-panel.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/loggers/:loggerId`: one logger's page, with what the member's role may change. */
export default function LabLoggerRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const loggerId = Number(useParams().loggerId);
  const can = (p: (typeof detail.permissions)[number]) => detail.permissions.includes(p);
  if (!can('loggers.read')) return <MissingPermission what="the loggers" />;
  return (
    <LoggerLoader slug={slug} loggerId={loggerId}>
      {(logger) => (
        <LoggerPage
          slug={slug}
          logger={logger}
          rights={{ manage: can('loggers.manage'), keys: can('ingest-keys.manage'), upload: can('uploads.create'), quarantine: can('quarantine.review') }}
          notes={
            can('channels.read') && (
              <LoggerNotesPanel slug={slug} loggerId={logger.id} timezone={logger.timezone} canEdit={can('loggers.manage') && logger.retiredAt === null} />
            )
          }
        />
      )}
    </LoggerLoader>
  );
}
