/**
 * Starts Lagbook's local outside services in one process, all on 127.0.0.1:
 *   - the OpenID Connect provider stand-in (the lab's institutional sign-in),
 *   - the Stripe API stand-in (the official SDK is pointed at it),
 *   - the SMTP mail capture (with an HTTP side to read captured mail).
 * MariaDB runs separately (mariadb.sh). Settings come from the same environment the app
 * reads, so both agree on ports, client id and secret. Prints `dev-services: ready` and, when
 * LAGBOOK_SERVICES_READY_FILE is set, writes the URLs there as JSON. SIGINT/SIGTERM stop it.
 */
import { writeFileSync } from 'node:fs';
import { startIdentityProvider } from './identity-provider/identity-provider.ts';
import { startStripeStandIn } from './stripe-stand-in/stripe-stand-in.ts';
import { startMailCapture } from './mail-capture/mail-capture.ts';
import { loadPlanCatalog } from '../server/services/billing/plan-catalog.ts';

function setting(name: string, fallback?: string): string {
  const value = process.env[name] ?? fallback;
  if (value === undefined || value === '') {
    process.stderr.write(`dev-services: ${name} is required but not set\n`);
    process.exit(1);
  }
  return value;
}

function portOf(url: string): number {
  return Number(new URL(url).port);
}

async function main(): Promise<void> {
  const publicUrl = setting('LAGBOOK_PUBLIC_URL', `http://127.0.0.1:${process.env.LAGBOOK_PORT ?? '4310'}`).replace(/\/$/, '');
  const issuer = setting('OIDC_ISSUER', 'http://127.0.0.1:4311');
  const stripeBase = setting('STRIPE_API_BASE', 'http://127.0.0.1:4312');
  const smtpPort = Number(setting('SMTP_PORT', '4325'));
  const mailHttpPort = Number(setting('LAGBOOK_MAIL_HTTP_PORT', '4326'));

  const started: Array<{ close(): Promise<void> }> = [];
  const stopAll = async () => {
    await Promise.allSettled(started.map((s) => s.close()));
  };
  try {
    const idp = await startIdentityProvider({
      port: portOf(issuer),
      clients: [
        {
          clientId: setting('OIDC_CLIENT_ID', 'lagbook-dev'),
          clientSecret: setting('OIDC_CLIENT_SECRET', 'lagbook-dev-secret'),
          redirectUris: [`${publicUrl}/auth/callback`],
          postLogoutRedirectUris: [`${publicUrl}/sign-in`],
        },
      ],
    });
    started.push(idp);
    // the catalog's paid plans become the stand-in's prices; its webhooks go to the app
    const catalog = loadPlanCatalog(setting('LAGBOOK_PLANS_FILE', 'tenants/plans.json'));
    const stripe = await startStripeStandIn({
      port: portOf(stripeBase),
      prices: catalog.plans
        .filter((p) => p.priceLookupKey !== null)
        .map((p) => ({
          lookupKey: p.priceLookupKey!,
          productName: `Lagbook ${p.name}`,
          unitAmount: p.monthlyAmount,
          currency: catalog.currency,
          interval: 'month' as const,
        })),
      webhook: { url: `${publicUrl}/api/v1/billing/stripe-webhooks`, secret: setting('STRIPE_WEBHOOK_SECRET', 'whsec_lagbook_local_stand_in') },
    });
    started.push(stripe);
    const mail = await startMailCapture({ smtpPort, httpPort: mailHttpPort });
    started.push(mail);

    const urls = { issuer: idp.issuer, stripe: stripe.url, smtpPort: mail.smtpPort, mailHttp: mail.httpUrl };
    if (process.env.LAGBOOK_SERVICES_READY_FILE) writeFileSync(process.env.LAGBOOK_SERVICES_READY_FILE, JSON.stringify(urls));
    process.stdout.write(
      `dev-services: ready — identity provider ${idp.issuer}, Stripe stand-in ${stripe.url}, ` +
        `mail capture smtp://127.0.0.1:${mail.smtpPort} (read it at ${mail.httpUrl}/messages)\n`,
    );
  } catch (err) {
    await stopAll();
    const e = err as NodeJS.ErrnoException;
    const why = e.code === 'EADDRINUSE' ? `a port is already in use (${e.message})` : e.message;
    process.stderr.write(`dev-services: could not start: ${why}\n`);
    process.exit(1);
  }

  const shutdown = () => {
    void stopAll().then(() => process.exit(0));
    setTimeout(() => process.exit(0), 3000).unref();
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}

void main();
