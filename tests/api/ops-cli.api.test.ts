import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, buildUser, sessionCookieFor } from '../support/factories.ts';
import { hashPersonalToken } from '../../server/services/personal-token-format.ts';

const run = promisify(execFile);

/** Runs `npm run ops -- …` the way operators do (node + tsx on the CLI entry). */
async function ops(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run('node', ['--import', 'tsx', 'server/cli/ops.ts', ...args], { env: process.env });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

describe('operator CLI', () => {
  it('--help documents the commands', async () => {
    const res = await ops('--help');
    expect(res.code).toBe(0);
    expect(res.stdout).toContain('create-lab --name <name> --admin <email>');
    expect(res.stdout).toContain('register-logger --lab <slug>');
    expect(res.stdout).toContain('mint-token --lab <slug> --email <member e-mail> --name <name>');
  });

  it("mint-token prints a personal token once; it reads the member's lab and is stored only hashed", async () => {
    const lab = await buildLab(t.db);
    const member = await buildMember(t.db, lab, { role: 'scientist' });
    const res = await ops('mint-token', '--lab', lab.slug, '--email', member.email.toUpperCase(), '--name', 'Field notebook', '--days', '7', '--json');
    expect(res.code).toBe(0);
    const out = JSON.parse(res.stdout);
    expect(out.token).toMatch(/^lbt_[0-9a-f]{12}_[A-Za-z0-9_-]{43}$/);
    const row = await t.db('personal_tokens').where({ tenant_id: lab.id, id: out.tokenId }).first();
    expect([row.user_id, row.name, row.token_hash]).toEqual([member.id, 'Field notebook', hashPersonalToken(out.token)]);
    expect(Math.abs(row.expires_at.getTime() - row.created_at.getTime() - 7 * 86_400_000)).toBeLessThan(1000);
    const read = await request(t.app).get(`/api/v1/labs/${lab.slug}/channels`).set('Authorization', `Bearer ${out.token}`).expect(200);
    expect(read.body.channels).toEqual([]);
    const text = await ops('mint-token', '--lab', lab.slug, '--email', member.email, '--name', 'Second');
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(/Token \(shown once; hand it to its owner now\):\n {2}lbt_[0-9a-f]{12}_/);
  });

  it('mint-token refuses guests, strangers and bad expiries with exit code 2', async () => {
    const lab = await buildLab(t.db);
    const guest = await buildMember(t.db, lab, { role: 'guest' });
    const stranger = await buildUser(t.db);
    const g = await ops('mint-token', '--lab', lab.slug, '--email', guest.email, '--name', 'x');
    expect([g.code, g.stderr.trim()]).toEqual([2, `ops: ${guest.email} is a guest in ${lab.slug}; personal tokens are for scientists and above.`]);
    const s = await ops('mint-token', '--lab', lab.slug, '--email', stranger.email, '--name', 'x');
    expect([s.code, s.stderr.trim()]).toEqual([2, `ops: ${stranger.email} is not a member of ${lab.slug}.`]);
    const d = await ops('mint-token', '--lab', lab.slug, '--email', guest.email, '--name', 'x', '--days', '400');
    expect([d.code, d.stderr.trim()]).toEqual([2, 'ops: expiresInDays: must be at most 365 days']);
    expect(await t.db('personal_tokens').where({ tenant_id: lab.id })).toHaveLength(0);
  });

  it('create-lab makes a person who has signed in before the admin at once', async () => {
    const user = await buildUser(t.db);
    const name = `Ops Lab ${Date.now()}`;
    const res = await ops('create-lab', '--name', name, '--admin', user.email, '--json');
    expect(res.code).toBe(0);
    const out = JSON.parse(res.stdout);
    expect(out.invitationLink).toBeNull();
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    const me = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(me.body.labs).toContainEqual({ slug: out.lab.slug, name, role: 'admin' });
  });

  it('create-lab for someone new prints an admin invitation link that works once they sign in', async () => {
    const email = `future-admin-${Date.now()}@ops.example`;
    const res = await ops('create-lab', '--name', `Ops New ${Date.now()}`, '--admin', email, '--json');
    expect(res.code).toBe(0);
    const { invitationLink, lab } = JSON.parse(res.stdout);
    const [, slug, token] = /\/join\/([^/]+)\/([^/]+)$/.exec(invitationLink)!;
    expect(slug).toBe(lab.slug);
    const user = await buildUser(t.db, { email });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    const accepted = await request(t.app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(200);
    expect(accepted.body.role).toBe('admin');
  });

  it('register-logger prints a key that stores readings for its channels', async () => {
    const user = await buildUser(t.db);
    const { stdout } = await ops('create-lab', '--name', `Ops Loggers ${Date.now()}`, '--admin', user.email, '--json');
    const { lab } = JSON.parse(stdout);
    const res = await ops(
      'register-logger',
      '--lab',
      lab.slug,
      '--name',
      'Incubator 2',
      '--interval',
      '60',
      '--timezone',
      'Europe/Oslo',
      '--channel',
      't:Chamber temperature:°C:30:40',
      '--channel',
      'co2:CO2:%',
      '--json',
    );
    expect(res.code).toBe(0);
    const out = JSON.parse(res.stdout);
    expect(out.channels.map((c: { key: string }) => c.key)).toEqual(['co2', 't']);
    const channel = await t.db('channels').where({ id: out.channels[1].id }).first();
    expect([channel.label, channel.unit, channel.valid_min, channel.valid_max]).toEqual(['Chamber temperature', '°C', 30, 40]);
    const ingest = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${out.ingestKey}`)
      .send({ readings: [{ channel: 't', ts: Date.now() - 5000, value: 37.1 }] })
      .expect(200);
    expect(ingest.body.accepted).toBe(1);
  });

  it('refuses bad input with a clear message and exit code 2', async () => {
    const noAdmin = await ops('create-lab', '--name', 'Lonely');
    expect([noAdmin.code, noAdmin.stderr.trim()]).toEqual([2, 'ops: --admin is required (see --help)']);
    const noLab = await ops('register-logger', '--lab', 'no-such-lab-here', '--name', 'x', '--interval', '60');
    expect([noLab.code, noLab.stderr.trim()]).toEqual([2, 'ops: No lab with the address "no-such-lab-here".']);
    const unknown = await ops('frobnicate');
    expect([unknown.code, unknown.stderr.trim()]).toEqual([2, 'ops: unknown command "frobnicate" (see --help)']);
  });
});
