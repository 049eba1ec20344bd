/**
 * Words the diagnostics screens write themselves around the server's report (what is missing
 * and why, the cross-correlation's plain statements). This file is the one place to review how
 * the diagnostics feature speaks to people; field labels and the method's words the server
 * shares live in `@shared/contract/words/diagnostics.ts`.
 */

export const DIAGNOSTICS_MESSAGES = {
  noLag: 'No lag could be computed.',
  rawNoLag: 'Raw CCF: no lag could be computed.',
  rawNotATest: 'Raw cross-correlation (not prewhitened): it is not a test of a relation between autocorrelated series.',
} as const;

/** A section the report could not fill, with the server's reason. */
export const noTrend = (reason: string): string => `No trend estimated: ${reason}`;
/** The process model could not be fitted, with the server's reason. */
export const noModel = (reason: string): string => `No model fitted: ${reason}`;
