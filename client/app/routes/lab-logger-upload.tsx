import { Link, useParams } from 'react-router-dom';
import type { LoggerDetail } from '@shared/contract/loggers.ts';
import { LoggerLoader } from '../../features/loggers/components/logger-loader.tsx';
import { UploadPanel } from '../../features/uploads/components/upload-panel.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { Notice } from '../../components/notice.tsx';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

function UploadInto({ slug, logger }: { slug: string; logger: LoggerDetail }) {
  return (
    <section aria-labelledby="upload-heading" className="grid gap-4">
      <div>
        <Link to={paths.labLogger.href(slug, logger.id)} className="text-sm text-lichen-dark underline-offset-2 hover:underline">
          ← {logger.name}
        </Link>
        <h2 id="upload-heading" className="text-xl font-semibold">
          Upload historical data to {logger.name}
        </h2>
        <p className="text-sm text-ink-soft">Sending the same file twice is safe: readings already stored are counted as duplicates, not stored again.</p>
      </div>
      {logger.retiredAt ? (
        <Notice tone="status">This logger is retired; its history cannot be extended.</Notice>
      ) : (
        <UploadPanel
          slug={slug}
          loggerId={logger.id}
          loggerTimeZone={logger.timezone}
          channels={logger.channels.filter((c) => !c.retiredAt).map((c) => ({ key: c.key, label: c.label }))}
          quarantineHref={paths.labQuarantine.href(slug, `loggerId=${logger.id}`)}
        />
      )}
    </section>
  );
}

/** `/labs/:lab/loggers/:loggerId/upload`: historical upload into one logger (technicians and admins). */
export default function LabLoggerUploadRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const loggerId = Number(useParams().loggerId);
  if (!detail.permissions.includes('uploads.create')) return <MissingPermission what="uploading files" />;
  return (
    <LoggerLoader slug={slug} loggerId={loggerId}>
      {(logger) => <UploadInto slug={slug} logger={logger} />}
    </LoggerLoader>
  );
}
