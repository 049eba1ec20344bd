import { describe, expect, it } from 'vitest';
import { AUDIT_ACTIONS } from '../audit.ts';
import { AUDIT_SENTENCES, auditSentence } from './audit.ts';

// Entries shaped as the services record them (summaries and details of server/services/**).
const paid = {
  action: 'billing.plan-changed',
  actor: null,
  summary: 'Plan changed from Seedling to Transect (Stripe invoice.paid)',
  details: { from: 'seedling', to: 'transect', event: 'evt_1' },
};

describe('audit sentences', () => {
  it('has a sentence for every action the log records', () => {
    const missing = AUDIT_ACTIONS.filter((a) => typeof (AUDIT_SENTENCES as Record<string, unknown>)[a] !== 'function');
    expect(missing).toEqual([]);
  });

  it("names plan changes in our words, never the payment service's event", () => {
    expect(auditSentence(paid)).toBe('Plan changed from Seedling to Transect after payment.');
    expect(
      auditSentence({
        ...paid,
        summary: 'Plan changed from Transect to Seedling (Stripe customer.subscription.deleted)',
        details: { from: 'transect', to: 'seedling' },
      }),
    ).toBe('Plan changed from Transect to Seedling as the subscription ended.');
  });

  it('says a failed payment and a recovery in words', () => {
    const failed = {
      action: 'billing.status-changed',
      actor: null,
      summary: 'Subscription status changed from active to past_due (Stripe invoice.payment_failed)',
      details: { from: 'active', to: 'past_due', event: 'evt_2', graceUntil: '2026-12-17T00:00:00.000Z' },
    };
    expect(auditSentence(failed)).toBe('Payment failed: the subscription is overdue (the lab keeps its plan until 2026-12-17).');
    expect(
      auditSentence({
        ...failed,
        summary: 'Subscription status changed from past_due to active (Stripe invoice.paid)',
        details: { from: 'past_due', to: 'active' },
      }),
    ).toBe('Subscription now paid up after payment (was payment overdue).');
  });

  it('names who invited whom, and a bulk repair without channel ids or layout codes', () => {
    expect(
      auditSentence({ action: 'invitation.created', actor: { name: 'Alice Ng' }, summary: 'x', details: { email: 'bob@lab.example', role: 'technician' } }),
    ).toBe('Alice Ng invited bob@lab.example as technician.');
    const mapped = {
      action: 'quarantine.bulk-channel-mapped',
      actor: { name: 'Ida Berg' },
      summary: 'Ida Berg mapped 3 quarantined row(s) to channel 42: 3 stored, 0 still quarantined',
      details: { action: { kind: 'map-channel', channelId: 42 }, counts: { selected: 3, stored: 3, alreadyStored: 0, stillQuarantined: 0 } },
    };
    expect(auditSentence(mapped)).toBe('Ida Berg stored 3 quarantined rows under another channel: 3 rows stored, 0 rows still in quarantine.');
    const shifted = {
      ...mapped,
      action: 'quarantine.bulk-shifted',
      details: { action: { kind: 'shift', offsetMinutes: -60 }, counts: { selected: 1, stored: 1, stillQuarantined: 0 } },
    };
    expect(auditSentence(shifted)).toBe('Ida Berg moved the times of 1 quarantined row back by 60 minutes: 1 row stored, 0 rows still in quarantine.');
  });

  it('keeps an action it does not know as recorded, and Lagbook as the author of its own actions', () => {
    expect(auditSentence({ action: 'demo.seeded', actor: null, summary: 'The demo scenario was loaded', details: null })).toBe('The demo scenario was loaded.');
    expect(auditSentence({ action: 'lab.exported', actor: null, summary: '', details: { channels: 1 } })).toBe(
      'Lagbook downloaded a full export of the lab (1 channel).',
    );
  });

  it('no sentence of any action names an identifier (camelCase, snake_case, dotted event names)', () => {
    const details = {
      from: 'active',
      to: 'past_due',
      email: 'a@b.example',
      role: 'guest',
      count: 2,
      accepted: 1,
      quarantined: 0,
      quarantinedAgain: 1,
      channels: 2,
    };
    for (const action of AUDIT_ACTIONS) {
      const sentence = auditSentence({ action, actor: { name: 'Alice Ng' }, summary: 'Alice Ng did it (Stripe customer.subscription.updated)', details });
      const words = sentence.replace(/\S+@\S+/g, '');
      expect(words, action).not.toMatch(/\b[a-z]+[A-Z][A-Za-z0-9]*\b|\b[a-z0-9]+_[a-z0-9_]+\b|\b[a-z]{2,}\.[a-z_.]+\b/);
    }
  });
});
