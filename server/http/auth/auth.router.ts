import { Router, type Request } from 'express';
import { OIDC_STRATEGY, type PassportInstance } from './passport-setup.ts';
import { SignInRefusedError } from '../../services/sign-in.service.ts';
import type { LogWriter } from '../../log-writer.ts';
import { DEFAULT_RATE_LIMITS, perClientLimit, type RateLimit } from '../middleware/rate-limits.ts';

const RETURN_TO_KEY = 'lagbookReturnTo';

/** Only same-site paths may be returned to after sign-in (no open redirects). */
export function safeReturnPath(value: unknown): string {
  if (typeof value !== 'string' || !value.startsWith('/') || value.startsWith('//') || value.includes('\\')) return '/';
  return value.slice(0, 512);
}

/**
 * Why a sign-in failed, as a short code the client's sign-in page turns into a message.
 * No account is created in any of these cases: the user row is written only after the
 * provider's tokens and profile have been verified.
 */
function failureCode(err: unknown, info: unknown): string {
  if (err instanceof SignInRefusedError) return 'no_email';
  if (err) return 'provider_error';
  const message = (info as { message?: string } | undefined)?.message ?? '';
  if (/state/i.test(message)) return 'state_mismatch';
  return 'cancelled';
}

/**
 * Sign-in and sign-out through the lab's OpenID Connect provider:
 * `GET /auth/sign-in[?returnTo=/path]` → provider → `GET /auth/callback` → back in Lagbook;
 * `POST /auth/sign-out` ends the session. Both redirects are rate-limited per client IP
 * (`signInLimit`, counted separately for each), since each costs a round trip to the provider.
 */
export function authRouter(deps: { passport: PassportInstance; logger: LogWriter; signInLimit?: RateLimit }): Router {
  const router = Router();
  const { passport, logger } = deps;
  const rule = deps.signInLimit ?? DEFAULT_RATE_LIMITS.signIn;

  router.get('/auth/sign-in', perClientLimit(rule, 'sign-in attempts'), (req, res, next) => {
    (req.session as unknown as Record<string, unknown>)[RETURN_TO_KEY] = safeReturnPath(req.query.returnTo);
    // "Use another account": ask the provider to show its login form even if it remembers
    // someone (OIDC Core §3.1.2.1 prompt=login), pre-filled with the expected address.
    const switchAccount = req.query.switchAccount === '1';
    const hint = typeof req.query.loginHint === 'string' && req.query.loginHint.length <= 191 ? req.query.loginHint : undefined;
    const options = switchAccount ? { prompt: 'login', loginHint: hint } : {};
    passport.authenticate(OIDC_STRATEGY, options as object)(req, res, next);
  });

  router.get('/auth/callback', perClientLimit(rule, 'sign-in callbacks'), (req: Request, res, next) => {
    const returnTo = safeReturnPath((req.session as unknown as Record<string, unknown> | undefined)?.[RETURN_TO_KEY]);
    passport.authenticate(OIDC_STRATEGY, (err: unknown, user: Express.User | false, info: unknown) => {
      if (err || !user) {
        const code = failureCode(err, info);
        if (err) logger.warn('sign-in failed', { code, reason: (err as Error).message });
        return res.redirect(303, `/sign-in?error=${code}`);
      }
      req.logIn(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        logger.info('signed in', { userId: user.id });
        res.redirect(303, returnTo);
      });
    })(req, res, next);
  });

  router.post('/auth/sign-out', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie('lagbook.sid');
        res.status(204).end();
      });
    });
  });

  return router;
}
