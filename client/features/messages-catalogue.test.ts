import { describe, expect, it } from 'vitest';

/**
 * Every feature's message catalogue (`client/features/<feature>/messages.ts`) speaks to lab
 * scientists and technicians: no camelCase identifier, snake_case key or dotted path in any of
 * its texts, and no "undefined", "NaN" or "[object …]" from a template gone wrong. Texts are
 * walked whole (strings, nested objects); functions are called with the sample values below —
 * a new function without samples fails the test, so every text gets checked.
 */
const CATALOGUES = import.meta.glob<Record<string, unknown>>('./*/messages.ts', { eager: true });

// Sample values (invented, plain words; the check is on the words the templates add).
const READING = { logger: 'Hedgerow mast', channel: 'air temperature', ts: '2026-09-01 00:10:00', value: '12.3', reason: 'the value is not a number' };
const SAMPLES: Record<string, unknown[][]> = {
  'alerts.ruleMade': [['Cold room too warm', 'Room temperature']],
  'alerts.deleteRuleQuestion': [['Cold room too warm']],
  'alerts.durationWords': [[0], [1], [300], [5400], [604_800]],
  'quarantine.rows': [[1], [12_000]],
  'quarantine.readingName': [[{ channel: 'air temperature', ts: '2026-09-01 00:10:00' }], [{ channel: null, ts: null }]],
  'quarantine.plainReason': [['ts: "2026-09-01 00:10" has no offset'], ['value: must be a number'], ['channel: no channel "x" on this logger']],
  'quarantine.readingBackInQuarantine': [[READING], [{ ...READING, logger: null, value: null }]],
  'quarantine.resubmitSummary': [[{ resubmitted: 3, accepted: 1, duplicates: 1, again: 1 }]],
  'quarantine.discardQuestion': [[1], [40]],
  'quarantine.discardedNotice': [[2]],
  'loggers.wouldGoToQuarantine': [['air temperature', 'the channel is retired.']],
  'loggers.retireLoggerQuestion': [['Hedgerow mast']],
  'uploads.uploadRefused': [[502]],
  'invitations.invitationProblem': [['invitation_expired'], ['some_code_this_client_does_not_know']],
  'invitations.invitationSent': [['bob@example.org']],
  'invitations.revokeInvitationQuestion': [['bob@example.org']],
  'members.removeMemberQuestion': [['Odalys Brennick']],
  'members.leaveLabQuestion': [['Fernhollow Field Station']],
  'notes.lastChangedBy': [['Odalys Brennick']],
  'channels.tooManyTogether': [[6, 'Lower terrace · Berry temperature']],
  'tokens.revokeTokenQuestion': [['Soil notebook']],
  'audit.auditActionLabel': [['lab.created'], ['payment.some-event-this-client-does-not-know']],
  'diagnostics.noTrend': [['the series is constant']],
  'diagnostics.noModel': [['too few cells for the model']],
  'billing.planConfirmed': [
    ['Transect', 'payment'],
    ['Transect', 'switch'],
  ],
};

/** What must never appear in a text people read, each with why. */
const FORBIDDEN: Array<[RegExp, string]> = [
  [/\b[a-z]+[A-Z][A-Za-z0-9]*\b/, 'a camelCase identifier'],
  [/\b[A-Za-z0-9]+_[A-Za-z0-9_]+\b/, 'a snake_case key'],
  [/\b(?!e\.g\b|i\.e\b)[a-z]+\.[a-z][A-Za-z0-9]*\b/, 'a dotted path'],
  [/\bundefined\b|\bNaN\b|\[object \w+\]/, 'a template gone wrong'],
];

/** Every text of one export: strings as they are, objects walked, functions called with their samples. */
function textsOf(name: string, value: unknown): string[] {
  if (typeof value === 'string') return [value];
  if (typeof value === 'function') {
    const samples = SAMPLES[name];
    if (!samples) throw new Error(`${name} is a function with no sample values in messages-catalogue.test.ts`);
    return samples.flatMap((args) => textsOf(`${name}()`, (value as (...a: unknown[]) => unknown)(...args)));
  }
  if (Array.isArray(value)) return value.flatMap((v, i) => textsOf(`${name}[${i}]`, v));
  if (value !== null && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => textsOf(`${name}.${k}`, v));
  return [];
}

const entries = Object.entries(CATALOGUES).map(([file, mod]) => [/^\.\/([^/]+)\/messages\.ts$/.exec(file)![1], mod] as const);

describe('the message catalogues of the client features', () => {
  it('are found (one per feature that writes its own texts)', () => {
    expect(entries.map(([feature]) => feature).sort()).toEqual(expect.arrayContaining(['alerts', 'labs', 'quarantine']));
  });

  it.each(entries)('%s: every text is in plain words', (feature, mod) => {
    const problems: string[] = [];
    let count = 0;
    for (const [name, value] of Object.entries(mod)) {
      for (const text of textsOf(`${feature}.${name}`, value)) {
        count += 1;
        // an e-mail address is the person's data, not a key
        const words = text.replace(/[^\s@]+@[^\s@]+\.\w+/g, 'an address');
        for (const [re, what] of FORBIDDEN) {
          const hit = re.exec(words);
          if (hit) problems.push(`${feature}.${name}: ${what} (“${hit[0]}”) in “${text}”`);
        }
      }
    }
    expect(count).toBeGreaterThan(0);
    expect(problems).toEqual([]);
  });

  it('has no sample values for a function that no longer exists', () => {
    const known = new Set(entries.flatMap(([feature, mod]) => Object.keys(mod).map((name) => `${feature}.${name}`)));
    expect(Object.keys(SAMPLES).filter((name) => !known.has(name))).toEqual([]);
  });

  it('the checks catch what they are meant to (self-test on bad texts)', () => {
    const bad = ['validMin must be below validMax', 'role lab_admin', 'needs channel.read', 'got undefined'];
    for (const text of bad) expect(FORBIDDEN.some(([re]) => re.test(text))).toBe(true);
    for (const text of ['Choose the channel to watch', 'e.g. 12.5 °C', 'Discard 3 rows for good?']) expect(FORBIDDEN.some(([re]) => re.test(text))).toBe(false);
  });
});
