import type { CapturedMail } from './mail-capture.ts';

/** The mail capture's HTTP side could not be read. */
export class MailCaptureReadError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MailCaptureReadError';
  }
}

/** No captured message matched before the deadline; the message lists what did arrive. */
export class MailWaitTimeoutError extends Error {
  readonly arrived: CapturedMail[];

  constructor(timeoutMs: number, arrived: CapturedMail[]) {
    const summary = arrived.length ? arrived.map((mail) => `  - to ${mail.to.join(', ')}: "${mail.subject}"`).join('\n') : '  (none)';
    super(`No captured mail matched within ${timeoutMs} ms. Messages that did arrive (${arrived.length}):\n${summary}`);
    this.name = 'MailWaitTimeoutError';
    this.arrived = arrived;
  }
}

/** Reads the captured messages (oldest first) from the capture's HTTP side, optionally only those sent to one address. */
export async function fetchCapturedMail(httpUrl: string, filter: { to?: string } = {}): Promise<CapturedMail[]> {
  const url = new URL('/messages', httpUrl);
  if (filter.to) url.searchParams.set('to', filter.to);
  let response: Response;
  try {
    response = await fetch(url);
  } catch (error) {
    throw new MailCaptureReadError(`Mail capture at ${httpUrl} is not reachable: ${(error as Error).message}`);
  }
  if (!response.ok) throw new MailCaptureReadError(`Mail capture at ${httpUrl} answered ${response.status}`);
  return (await response.json()) as CapturedMail[];
}

/**
 * Polls the capture until a message satisfies `predicate` and returns it, so a test can wait
 * for mail that the app sends asynchronously; throws {@link MailWaitTimeoutError} after `timeoutMs`.
 */
export async function waitForMail(httpUrl: string, predicate: (m: CapturedMail) => boolean, timeoutMs = 5000): Promise<CapturedMail> {
  const deadline = Date.now() + timeoutMs;
  const pollMs = 50;
  for (;;) {
    const messages = await fetchCapturedMail(httpUrl);
    const found = messages.find(predicate);
    if (found) return found;
    if (Date.now() >= deadline) throw new MailWaitTimeoutError(timeoutMs, messages);
    await new Promise((resolve) => setTimeout(resolve, Math.min(pollMs, Math.max(0, deadline - Date.now()))));
  }
}
