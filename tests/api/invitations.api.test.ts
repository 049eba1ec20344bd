import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, buildUser, sessionCookieFor, standInAppDeps, type TestLab } from '../support/factories.ts';
import { fetchCapturedMail, waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { createApp } from '../../server/app.ts';

const mailUrl = process.env.LAGBOOK_MAIL_CAPTURE_URL!;
let t: TestApp;
let clock = Date.now();

beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

/** The same app with a movable clock, to check expiry. */
function appWithClock() {
  return createApp(
    standInAppDeps(t, {
      mailer: {
        send: (m) =>
          import('../../server/integrations/mail/create-mailer.ts').then(({ createMailer }) => {
            const real = createMailer(t.config.smtp);
            return real.send(m).finally(() => real.close());
          }),
        verify: async () => true,
        close: () => {},
      },
      now: () => new Date(clock),
    }),
  );
}

let lab: TestLab;
let adminCookie: string;
beforeEach(async () => {
  clock = Date.now();
  lab = await buildLab(t.db, { name: `Invite Lab ${Date.now()}` });
  const admin = await buildMember(t.db, lab, { role: 'admin', displayName: 'Ada Inviter' });
  adminCookie = await sessionCookieFor(t.db, t.config.sessionSecret, admin.id);
});

function linkFrom(text: string): { slug: string; token: string } {
  const m = /\/join\/([a-z0-9-]+)\/([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no invitation link in: ${text}`);
  return { slug: m[1], token: m[2] };
}

function invite(app: Parameters<typeof request>[0], email: string, role = 'technician') {
  return request(app).post(`/api/v1/labs/${lab.slug}/invitations`).set('Cookie', adminCookie).send({ email, role });
}

describe('invitations', () => {
  it('invites by e-mail; the invited person follows the link, signs in with that address and joins with the role', async () => {
    const email = `newcomer-${Date.now()}@field.example`;
    const res = await invite(t.app, email.toUpperCase()).expect(201);
    expect(res.body.invitation).toEqual(expect.objectContaining({ email, role: 'technician', invitedBy: expect.objectContaining({ name: 'Ada Inviter' }) }));
    expect(JSON.stringify(res.body)).not.toMatch(/token/i);

    const mail = await waitForMail(mailUrl, (m) => m.to.includes(email));
    expect(mail.subject).toBe(`Join ${lab.name} on Lagbook`);
    expect(mail.text).toContain('Ada Inviter invites you to join');
    const { slug, token } = linkFrom(mail.text);
    expect(slug).toBe(lab.slug);
    expect(mail.text).toContain(`${t.config.publicUrl}/join/${slug}/${token}`);
    // Only the hash is stored.
    const stored = await t.db('invitations').where({ tenant_id: lab.id, email }).first();
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored.token_hash).not.toContain(token);

    const invitee = await buildUser(t.db, { email });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, invitee.id);
    const preview = await request(t.app).get(`/api/v1/invitations/${slug}/${token}`).set('Cookie', cookie).expect(200);
    expect(preview.body).toEqual({
      invitation: { lab: { slug, name: lab.name }, role: 'technician', email, invitedBy: { name: 'Ada Inviter' }, expiresAt: expect.any(String) },
      matchesSignedInUser: true,
    });
    const accepted = await request(t.app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(200);
    expect(accepted.body).toEqual({ lab: { slug, name: lab.name }, role: 'technician' });
    const me = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(me.body.labs).toEqual([{ slug, name: lab.name, role: 'technician' }]);

    // single use
    const again = await request(t.app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(410);
    expect(again.body.error).toEqual({ code: 'invitation_used', message: 'This invitation has already been used.' });
    const audit = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit`).set('Cookie', adminCookie).expect(200);
    expect(audit.body.entries.map((e: { action: string }) => e.action)).toEqual(['invitation.accepted', 'invitation.created']);
  });

  it.each([
    [{ email: 'not-an-address', role: 'guest' }, 'E-mail address: must be a valid e-mail address.'],
    [{ email: 'a@b.example', role: 'owner' }, 'Role: must be one of admin, technician, scientist, guest.'],
    [{ role: 'guest' }, 'E-mail address: is required.'],
  ])('refuses %j with 400 and the exact message, sending nothing', async (body, message) => {
    const before = (await fetchCapturedMail(mailUrl)).length;
    const res = await request(t.app).post(`/api/v1/labs/${lab.slug}/invitations`).set('Cookie', adminCookie).send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
    expect(await t.db('invitations').where({ tenant_id: lab.id })).toEqual([]);
    expect((await fetchCapturedMail(mailUrl)).length).toBe(before);
  });

  it('refuses a duplicate pending invitation and an invitation to a member', async () => {
    const email = `dup-${Date.now()}@field.example`;
    await invite(t.app, email).expect(201);
    const dup = await invite(t.app, email, 'guest').expect(409);
    expect(dup.body.error).toEqual({
      code: 'invitation_pending',
      message: 'E-mail address: an invitation to this address is already waiting.',
      fields: [{ field: 'email', label: 'E-mail address', reason: 'an invitation to this address is already waiting' }],
    });
    const member = await buildMember(t.db, lab, { role: 'guest' });
    const already = await invite(t.app, member.email).expect(409);
    expect(already.body.error.code).toBe('already_member');
    expect(await t.db('invitations').where({ tenant_id: lab.id })).toHaveLength(1);
  });

  it('an invitation opened while signed in as someone else is refused and changes nothing', async () => {
    const email = `right-${Date.now()}@field.example`;
    await invite(t.app, email).expect(201);
    const { slug, token } = linkFrom((await waitForMail(mailUrl, (m) => m.to.includes(email))).text);
    const other = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, other.id);
    const preview = await request(t.app).get(`/api/v1/invitations/${slug}/${token}`).set('Cookie', cookie).expect(200);
    expect(preview.body.matchesSignedInUser).toBe(false);
    const res = await request(t.app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(403);
    expect(res.body.error).toEqual({ code: 'invitation_wrong_account', message: `This invitation is for ${email}. Sign in with that address to accept it.` });
    expect(await t.db('memberships').where({ tenant_id: lab.id, user_id: other.id })).toEqual([]);
  });

  it('an unverified e-mail address cannot accept', async () => {
    const email = `unverified-${Date.now()}@field.example`;
    await invite(t.app, email).expect(201);
    const { slug, token } = linkFrom((await waitForMail(mailUrl, (m) => m.to.includes(email))).text);
    const u = await buildUser(t.db, { email, emailVerified: false });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, u.id);
    await request(t.app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(403);
  });

  it('an expired link answers 410 and changes nothing', async () => {
    const app = appWithClock();
    const email = `late-${Date.now()}@field.example`;
    await invite(app, email).expect(201);
    const { slug, token } = linkFrom((await waitForMail(mailUrl, (m) => m.to.includes(email))).text);
    const u = await buildUser(t.db, { email });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, u.id);
    clock += 7 * 24 * 3600 * 1000 + 1;
    const res = await request(app).post(`/api/v1/invitations/${slug}/${token}/accept`).set('Cookie', cookie).expect(410);
    expect(res.body.error).toEqual({ code: 'invitation_expired', message: 'This invitation has expired. Ask the lab admin to send it again.' });
    expect(await t.db('memberships').where({ tenant_id: lab.id, user_id: u.id })).toEqual([]);
  });

  it('resend sends a new link and the old one stops working; revoke withdraws it', async () => {
    const email = `resend-${Date.now()}@field.example`;
    const created = await invite(t.app, email).expect(201);
    const first = linkFrom((await waitForMail(mailUrl, (m) => m.to.includes(email))).text);
    await request(t.app).post(`/api/v1/labs/${lab.slug}/invitations/${created.body.invitation.id}/resend`).set('Cookie', adminCookie).expect(200);
    const second = linkFrom((await waitForMail(mailUrl, (m) => m.to.includes(email) && !m.text.includes(first.token))).text);
    expect(second.token).not.toBe(first.token);
    const u = await buildUser(t.db, { email });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, u.id);
    await request(t.app).get(`/api/v1/invitations/${first.slug}/${first.token}`).set('Cookie', cookie).expect(404);

    const list = await request(t.app).get(`/api/v1/labs/${lab.slug}/invitations`).set('Cookie', adminCookie).expect(200);
    expect(list.body.invitations.map((i: { email: string }) => i.email)).toEqual([email]);
    await request(t.app).delete(`/api/v1/labs/${lab.slug}/invitations/${created.body.invitation.id}`).set('Cookie', adminCookie).expect(204);
    const revoked = await request(t.app).post(`/api/v1/invitations/${second.slug}/${second.token}/accept`).set('Cookie', cookie).expect(410);
    expect(revoked.body.error.code).toBe('invitation_revoked');
    const after = await request(t.app).get(`/api/v1/labs/${lab.slug}/invitations`).set('Cookie', adminCookie).expect(200);
    expect(after.body.invitations).toEqual([]);
  });

  it('a made-up link answers 404 invitation_not_found', async () => {
    const u = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, u.id);
    const res = await request(t.app)
      .get(`/api/v1/invitations/${lab.slug}/${'x'.repeat(43)}`)
      .set('Cookie', cookie)
      .expect(404);
    expect(res.body.error.code).toBe('invitation_not_found');
    await request(t.app)
      .get(`/api/v1/invitations/${lab.slug}/${'x'.repeat(43)}`)
      .expect(401);
  });

  it('when the mail server is down the invitation is not saved and the admin is told', async () => {
    const app = createApp(
      standInAppDeps(t, {
        mailer: {
          send: async () => {
            throw new Error('ECONNREFUSED');
          },
          verify: async () => false,
          close: () => {},
        },
      }),
    );
    const res = await request(app)
      .post(`/api/v1/labs/${lab.slug}/invitations`)
      .set('Cookie', adminCookie)
      .send({ email: 'nobody@field.example', role: 'guest' })
      .expect(503);
    expect(res.body.error.code).toBe('service_unavailable');
    expect(res.headers['retry-after']).toBe('30');
    expect(await t.db('invitations').where({ tenant_id: lab.id })).toEqual([]);
    expect(await t.db('audit_events').where({ tenant_id: lab.id, action: 'invitation.created' })).toEqual([]);
  });
});
