import { Logo } from '../../../components/logo.tsx';
import { serverSignInUrl } from '../../../app/paths.ts';
import { signInFailureMessage } from './sign-in-messages.ts';

/**
 * The sign-in card. Sign-in is a plain link to the server's OIDC start (a full navigation
 * to the identity provider), so no form posts across origins.
 */
export function SignInPanel({ errorCode, returnTo, signedOut }: { errorCode: string | null; returnTo: string | null; signedOut: boolean }) {
  const failure = signInFailureMessage(errorCode);
  return (
    <div className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-md rounded-2xl border border-rule bg-card p-8 shadow-sm">
        <Logo className="mb-6 text-ink" />
        <h1 className="text-2xl font-semibold">Sign in to your lab</h1>
        <p className="mt-2 text-ink-soft">
          Readings from every logger, and the time structure of every channel: cycles, trends, persistence and shocks that fade.
        </p>
        {failure && (
          <p role="alert" className="mt-5 rounded-lg border border-alert/30 bg-alert/5 p-3 text-sm text-alert">
            {failure}
          </p>
        )}
        {signedOut && !failure && (
          <p role="status" className="mt-5 rounded-lg border border-rule bg-paper p-3 text-sm">
            You are signed out.
          </p>
        )}
        <a href={serverSignInUrl(returnTo)} className="mt-6 block rounded-lg bg-lichen px-4 py-2.5 text-center font-medium text-paper hover:bg-lichen-dark">
          Continue with your institution's account
        </a>
        <p className="mt-4 text-xs text-ink-soft">Lagbook signs you in through your institution's identity provider; it never sees your password.</p>
      </div>
    </div>
  );
}
