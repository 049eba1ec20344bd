import { useState } from 'react';
import { Link } from 'react-router-dom';
import { IssuedKeyPanel } from '../../features/loggers/components/issued-key-panel.tsx';
import { LoggerRegisterForm, type RegisteredLogger } from '../../features/loggers/components/logger-register-form.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { buttonClasses } from '../../components/button.tsx';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

/**
 * `/labs/:lab/loggers/new`: the register form; once registered, the logger's first ingest key
 * is shown this one time, with an example command and the way on to the logger's page.
 */
export default function LabLoggerNewRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const [registered, setRegistered] = useState<RegisteredLogger | null>(null);
  if (!detail.permissions.includes('loggers.manage')) return <MissingPermission what="registering loggers" />;

  return (
    <section aria-labelledby="register-heading" className="grid gap-5">
      <h2 id="register-heading" className="text-xl font-semibold">
        {registered ? `${registered.logger.name} is registered` : 'Register a logger'}
      </h2>
      {registered ? (
        <IssuedKeyPanel issued={registered.ingestKey} channel={registered.logger.channels[0]} heading="The logger's ingest key">
          <div>
            <Link to={paths.labLogger.href(slug, registered.logger.id)} className={buttonClasses('primary')}>
              I have stored the key — open the logger
            </Link>
          </div>
        </IssuedKeyPanel>
      ) : (
        <LoggerRegisterForm slug={slug} onRegistered={setRegistered} />
      )}
    </section>
  );
}
