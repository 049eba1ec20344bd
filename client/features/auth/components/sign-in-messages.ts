/**
 * What the sign-in page says for each failure code the server's callback can send back
 * (`/sign-in?error=<code>`). In every case nothing was created or changed.
 */
export const signInFailureMessages: Record<string, string> = {
  cancelled: 'Sign-in was cancelled at your identity provider. Nothing was changed; you can start again.',
  state_mismatch: 'This sign-in could not be matched to one started in this browser (it may have expired or come from another tab). Please start again.',
  no_email: 'Your identity provider did not share an e-mail address, which Lagbook needs to match you to your lab.',
  provider_error: 'Your identity provider did not complete the sign-in. Try again; if it keeps failing, ask your lab admin.',
};

/** The message for a failure code, or a generic one for codes this client does not know. */
export function signInFailureMessage(code: string | null): string | null {
  if (!code) return null;
  return signInFailureMessages[code] ?? 'Sign-in did not complete. Please start again.';
}
