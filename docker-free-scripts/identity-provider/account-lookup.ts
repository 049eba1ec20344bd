import { createHash, timingSafeEqual } from 'node:crypto';
import type { DevAccount } from '../../tenants/demo/people.ts';

function digest(value: string): Buffer {
  return createHash('sha256').update(value, 'utf8').digest();
}

/**
 * Finds the dev account whose e-mail (compared case-insensitively, as mailbox domains are)
 * and password both match, or null. Passwords are compared in constant time so the stand-in
 * does not teach the app's tests a habit the real provider would not tolerate.
 */
export function matchDevAccount(accounts: readonly DevAccount[], email: string, password: string): DevAccount | null {
  const wanted = email.trim().toLowerCase();
  const account = accounts.find((candidate) => candidate.email.toLowerCase() === wanted);
  if (!account) return null;
  return timingSafeEqual(digest(account.password), digest(password)) ? account : null;
}

/** Finds a dev account by its subject identifier, as the provider's `findAccount` needs. */
export function findDevAccountBySub(accounts: readonly DevAccount[], sub: string): DevAccount | undefined {
  return accounts.find((account) => account.sub === sub);
}
