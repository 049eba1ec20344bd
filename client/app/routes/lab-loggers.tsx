import { Link, useSearchParams } from 'react-router-dom';
import { useLoggers } from '../../features/loggers/api/get-loggers.ts';
import { LoggersTable } from '../../features/loggers/components/loggers-table.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { buttonClasses } from '../../components/button.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/loggers`: the lab's loggers (retired ones with `?retired=1`), and "Register a logger" for technicians and admins. */
export default function LabLoggersRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const [params, setParams] = useSearchParams();
  const includeRetired = params.get('retired') === '1';
  const loggers = useLoggers(slug, includeRetired);
  if (!detail.permissions.includes('loggers.read')) return <MissingPermission what="the loggers" />;

  return (
    <section aria-labelledby="loggers-heading" className="grid gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="loggers-heading" className="text-xl font-semibold">
          Loggers
        </h2>
        {detail.permissions.includes('loggers.manage') && (
          <Link to={paths.labLoggerNew.href(slug)} className={buttonClasses('primary')}>
            Register a logger
          </Link>
        )}
      </div>
      <label className="inline-flex items-center gap-2 text-sm">
        <input
          type="checkbox"
          checked={includeRetired}
          onChange={(e) => setParams(e.target.checked ? { retired: '1' } : {}, { replace: true })}
          className="h-4 w-4 accent-lichen"
        />
        Show retired loggers
      </label>
      {loggers.isPending ? (
        <LoadingNote what="Loading loggers…" />
      ) : loggers.isError ? (
        <Notice tone="alert">{loggers.error.message}</Notice>
      ) : (
        <LoggersTable slug={slug} loggers={loggers.data.loggers} />
      )}
    </section>
  );
}
