import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import type { Readable } from 'node:stream';
import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { startMailCaptureHttp } from './mail-capture-http.ts';

/** One message the capture received, reduced to what tests and developers look at. */
export interface CapturedMail {
  id: string;
  /** The From header as written, e.g. `Lagbook <noreply@lagbook.example>`; the envelope sender if there is none. */
  from: string;
  /** Envelope recipients, i.e. everyone it was delivered to, Bcc included. */
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** ISO 8601 time of the message's Date header, or of capture when it has none. */
  date: string;
}

/** Options of {@link startMailCapture}; 0 for either port picks a free one. */
export interface MailCaptureOptions {
  host?: string;
  smtpPort: number;
  httpPort: number;
  /** Largest message accepted in bytes; {@link MAX_MESSAGE_BYTES} unless told. */
  maxMessageBytes?: number;
}

/** A running mail capture. */
export interface RunningMailCapture {
  smtpPort: number;
  /** Base URL of the HTTP side (`/healthz`, `/messages`). */
  httpUrl: string;
  /** Captured messages, oldest first. */
  messages(): CapturedMail[];
  clear(): void;
  close(): Promise<void>;
}

/** Largest message accepted, announced with the SMTP SIZE extension (RFC 1870). */
export const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

/** An SMTP error with the reply code smtp-server sends back to the client. */
class SmtpReplyError extends Error {
  readonly responseCode: number;

  constructor(responseCode: number, message: string) {
    super(message);
    this.name = 'SmtpReplyError';
    this.responseCode = responseCode;
  }
}

async function captureMessage(stream: SMTPServerDataStream, session: SMTPServerSession, maxBytes: number): Promise<CapturedMail> {
  const parsed = await simpleParser(stream as Readable);
  if (stream.sizeExceeded) {
    // RFC 1870 §6.2: 552 when the message exceeds the fixed maximum size.
    throw new SmtpReplyError(552, `Message exceeds the capture's limit of ${maxBytes} bytes`);
  }
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
  return {
    id: randomUUID(),
    from: parsed.from?.text || envelopeFrom,
    to: session.envelope.rcptTo.map((recipient) => recipient.address),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
    date: (parsed.date ?? new Date()).toISOString(),
  };
}

/**
 * Starts a local SMTP server that accepts every message (no authentication, no TLS) and keeps
 * it in memory, plus a small HTTP side to read and clear what arrived. It lets nodemailer
 * deliver for real in development and tests without any mail leaving the machine.
 */
export async function startMailCapture(opts: MailCaptureOptions): Promise<RunningMailCapture> {
  const host = opts.host ?? '127.0.0.1';
  const maxBytes = opts.maxMessageBytes ?? MAX_MESSAGE_BYTES;
  let captured: CapturedMail[] = [];

  const smtp = new SMTPServer({
    authOptional: true,
    // An app configured with SMTP credentials still gets through: any login is accepted in clear text.
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anonymous' }),
    disabledCommands: ['STARTTLS'],
    size: maxBytes,
    closeTimeout: 500,
    disableReverseLookup: true,
    logger: false,
    banner: 'Lagbook local mail capture (development only)',
    onData(stream, session, callback) {
      captureMessage(stream, session, maxBytes).then(
        (mail) => {
          captured.push(mail);
          callback(null, `Captured as ${mail.id}`);
        },
        (error: Error) => callback(error),
      );
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, host, () => {
      smtp.off('error', reject);
      resolve();
    });
  });
  // A client dropping its connection mid-message must not bring the capture down.
  smtp.on('error', (error: Error) => process.stderr.write(`mail-capture: ${error.message}\n`));
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  const clear = () => {
    captured = [];
  };
  const closeSmtp = () => new Promise<void>((resolve) => smtp.close(() => resolve()));
  const http = await startMailCaptureHttp({ host, port: opts.httpPort, messages: () => captured, clear }).catch(async (error: unknown) => {
    await closeSmtp();
    throw error;
  });

  return {
    smtpPort,
    httpUrl: http.url,
    messages: () => [...captured],
    clear,
    close: async () => {
      await Promise.all([http.close(), closeSmtp()]);
    },
  };
}
