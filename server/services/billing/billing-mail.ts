import type { OutgoingMail } from '../../integrations/mail/create-mailer.ts';

const day = (d: Date) => d.toISOString().slice(0, 10);
const grouped = (n: number) => n.toLocaleString('en-GB');

/** The storage warning sent to each admin when a lab's stored readings cross 80% or reach 100% of its plan. */
export function usageWarningMail(input: {
  to: string;
  labName: string;
  planName: string;
  percent: 80 | 100;
  used: number;
  allowed: number;
  link: string;
}): OutgoingMail {
  const full = input.percent === 100;
  const subject = full ? `${input.labName}: storage full — loggers are being refused` : `${input.labName}: 80% of the plan's storage used`;
  const text = [
    `${input.labName} stores ${grouped(input.used)} readings; the ${input.planName} plan allows ${grouped(input.allowed)}.`,
    '',
    full
      ? 'New batches from the loggers are refused (they are told to retry later, and keep their readings until then). Everything already stored stays readable.'
      : 'When the limit is reached, new batches from the loggers will be refused until the plan is raised.',
    '',
    `Review usage and plans: ${input.link}`,
  ].join('\n');
  return { to: input.to, subject, text };
}

/** Sent to each admin when a payment failed: the plan keeps working until the grace period ends. */
export function paymentFailedMail(input: { to: string; labName: string; planName: string; graceUntil: Date; link: string }): OutgoingMail {
  const text = [
    `A payment for the ${input.planName} plan of ${input.labName} failed.`,
    '',
    `The plan keeps working until ${day(input.graceUntil)}. After that the lab falls back to the free plan's limits (no data is deleted).`,
    '',
    `Update the card or pay the open invoice: ${input.link}`,
  ].join('\n');
  return { to: input.to, subject: `${input.labName}: payment failed — plan kept until ${day(input.graceUntil)}`, text };
}
