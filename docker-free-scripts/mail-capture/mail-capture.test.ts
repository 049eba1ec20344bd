import nodemailer from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMailCapture, type RunningMailCapture } from './mail-capture.ts';
import { fetchCapturedMail, MailWaitTimeoutError, waitForMail } from './read-captured-mail.ts';

// Delivery semantics checked here: SMTP envelope recipients include Bcc (RFC 5321 §3.3 and
// RFC 5322 §3.6.3), and a message over the announced SIZE gets reply 552 (RFC 1870 §6.2).

let capture: RunningMailCapture;

function transport(port: number) {
  return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
}

beforeAll(async () => {
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
});

afterAll(async () => {
  await capture?.close();
});

beforeEach(() => {
  capture.clear();
});

const STORAGE_NOTICE = {
  from: 'Lagbook <noreply@lagbook.example>',
  to: 'Odalys.Brennick@fernhollow.example',
  bcc: 'audit@fernhollow.example',
  subject: 'Fernhollow Field Station has used 80% of its storage',
  text: 'Your lab holds 8.0 GB of its 10 GB.',
  html: '<p>Your lab holds <strong>8.0 GB</strong> of its 10 GB.</p>',
};

describe('mail capture', () => {
  it('captures a message with text and HTML parts, readable in-process and over HTTP', async () => {
    await transport(capture.smtpPort).sendMail(STORAGE_NOTICE);
    const [mail] = capture.messages();
    expect(capture.messages()).toHaveLength(1);
    expect(mail.from).toBe('"Lagbook" <noreply@lagbook.example>');
    expect(mail.to).toEqual(['Odalys.Brennick@fernhollow.example', 'audit@fernhollow.example']);
    expect(mail.subject).toBe(STORAGE_NOTICE.subject);
    expect(mail.text.trim()).toBe(STORAGE_NOTICE.text);
    expect(mail.html).toBe(STORAGE_NOTICE.html);
    expect(mail.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(Math.abs(Date.parse(mail.date) - Date.now())).toBeLessThan(60_000);

    const health = await fetch(`${capture.httpUrl}/healthz`);
    expect(await health.json()).toEqual({ ok: true });
    expect(await fetchCapturedMail(capture.httpUrl)).toEqual([mail]);
  });

  it('gives html null for a text-only message and keeps messages oldest first', async () => {
    const sender = transport(capture.smtpPort);
    await sender.sendMail({ from: 'noreply@lagbook.example', to: 'maren.olowe@fernhollow.example', subject: 'first', text: 'one' });
    await sender.sendMail({ from: 'noreply@lagbook.example', to: 'maren.olowe@fernhollow.example', subject: 'second', text: 'two' });
    const messages = await fetchCapturedMail(capture.httpUrl);
    expect(messages.map((mail) => mail.subject)).toEqual(['first', 'second']);
    expect(messages[0].html).toBeNull();
  });

  it('filters by recipient case-insensitively, Bcc included, and clears with DELETE', async () => {
    const sender = transport(capture.smtpPort);
    await sender.sendMail(STORAGE_NOTICE);
    await sender.sendMail({ from: 'noreply@lagbook.example', to: 'tobiah.quarrie@fernhollow.example', subject: 'Logger silent', text: 'x' });

    const toOdalys = await fetchCapturedMail(capture.httpUrl, { to: 'odalys.brennick@FERNHOLLOW.example' });
    expect(toOdalys.map((mail) => mail.subject)).toEqual([STORAGE_NOTICE.subject]);
    expect(await fetchCapturedMail(capture.httpUrl, { to: 'audit@fernhollow.example' })).toHaveLength(1);
    expect(await fetchCapturedMail(capture.httpUrl, { to: 'nobody@fernhollow.example' })).toEqual([]);

    const cleared = await fetch(`${capture.httpUrl}/messages`, { method: 'DELETE' });
    expect(cleared.status).toBe(204);
    expect(await fetchCapturedMail(capture.httpUrl)).toEqual([]);
    expect(capture.messages()).toEqual([]);
  });

  it('waits for mail that arrives later', async () => {
    const waiting = waitForMail(capture.httpUrl, (mail) => mail.subject === 'Logger silent', 3000);
    setTimeout(() => {
      void transport(capture.smtpPort).sendMail({
        from: 'noreply@lagbook.example',
        to: 'tobiah.quarrie@fernhollow.example',
        subject: 'Logger silent',
        text: 'Greenhouse logger 3 has not reported for 30 minutes.',
      });
    }, 150);
    const mail = await waiting;
    expect(mail.to).toEqual(['tobiah.quarrie@fernhollow.example']);
  });

  it('times out with a message listing what did arrive', async () => {
    await transport(capture.smtpPort).sendMail(STORAGE_NOTICE);
    const started = Date.now();
    const failure = await waitForMail(capture.httpUrl, (mail) => mail.subject === 'never sent', 300).catch((error: unknown) => error);
    expect(Date.now() - started).toBeGreaterThanOrEqual(300);
    expect(failure).toBeInstanceOf(MailWaitTimeoutError);
    const message = (failure as Error).message;
    expect(message).toContain('No captured mail matched within 300 ms');
    expect(message).toContain(STORAGE_NOTICE.subject);
    expect(message).toContain('audit@fernhollow.example');
  });

  it('refuses a message over its size limit with SMTP reply 552', async () => {
    const small = await startMailCapture({ smtpPort: 0, httpPort: 0, maxMessageBytes: 2048 });
    try {
      const failure = await transport(small.smtpPort)
        .sendMail({ from: 'noreply@lagbook.example', to: 'maren.olowe@fernhollow.example', subject: 'big', text: 'x'.repeat(10_000) })
        .catch((error: unknown) => error);
      expect((failure as { responseCode?: number }).responseCode).toBe(552);
      expect(small.messages()).toEqual([]);
    } finally {
      await small.close();
    }
  });

  it('rejects with EADDRINUSE when either port is taken, instead of crashing', async () => {
    const httpUrl = new URL(capture.httpUrl);
    await expect(startMailCapture({ smtpPort: capture.smtpPort, httpPort: 0 })).rejects.toMatchObject({ code: 'EADDRINUSE' });
    await expect(startMailCapture({ smtpPort: 0, httpPort: Number(httpUrl.port) })).rejects.toMatchObject({ code: 'EADDRINUSE' });
    // The running capture is unaffected.
    expect((await fetch(`${capture.httpUrl}/healthz`)).status).toBe(200);
  });

  it('answers unknown routes with 404 and other methods on /messages with 405', async () => {
    expect((await fetch(`${capture.httpUrl}/nothing`)).status).toBe(404);
    expect((await fetch(`${capture.httpUrl}/messages`, { method: 'POST' })).status).toBe(405);
  });
});
