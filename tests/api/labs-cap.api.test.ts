/**
 * Labs per account (#15 finding 11), on the real MariaDB: a person may create
 * LAGBOOK_MAX_LABS_PER_ACCOUNT labs (3 by default), LAGBOOK_MAX_LABS_PER_PAID_ADMIN (10) once
 * they administer a lab on a paid plan; the next is refused with 403 naming the cap; creations
 * at once cannot pass the cap together (the person's row is locked while counting).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildUser, sessionCookieFor } from '../support/factories.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { createLabsService } from '../../server/services/labs.service.ts';
import { up as backfillLabCreators } from '../../migrations/20261203150110_backfill-lab-creator.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

const FREE_CAP_MESSAGE = 'You have created 3 labs; one account may create at most 3. Admins of a lab on a paid plan may create up to 10.';

async function person() {
  const user = await buildUser(t.db);
  return { user, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, user.id) };
}
const create = (cookie: string, name: string) => request(t.app).post('/api/v1/labs').set('Cookie', cookie).send({ name });
const createdBy = async (userId: number) => Number((await t.db('labs').where({ created_by_user_id: userId }).count({ n: '*' }).first())!.n);

describe('labs per account', () => {
  it('lets a person create 3 labs and refuses the 4th with 403 naming the cap, changing nothing', async () => {
    expect(t.config.labCreation).toEqual({ perAccount: 3, perPaidAdmin: 10 });
    const { user, cookie } = await person();
    for (let i = 1; i <= 3; i++) await create(cookie, `Moorland Plot ${i}`).expect(201);
    const labsBefore = Number((await t.db('labs').count({ n: '*' }).first())!.n);
    const refused = await create(cookie, 'Moorland Plot 4').expect(403);
    expect(refused.body.error).toEqual({ code: 'lab_limit_reached', message: FREE_CAP_MESSAGE });
    expect(Number((await t.db('labs').count({ n: '*' }).first())!.n)).toBe(labsBefore);
    expect(await t.db('memberships').where({ user_id: user.id })).toHaveLength(3);
    expect(await createdBy(user.id)).toBe(3);
  });

  it('counts labs the person created, not labs they joined or an operator made for them', async () => {
    const { user, cookie } = await person();
    for (let i = 0; i < 3; i++) {
      const joined = await buildLab(t.db);
      await t.db('memberships').insert({ tenant_id: joined.id, user_id: user.id, role: 'admin' });
    }
    await createLabsService({ db: t.db }).createForOperator({ name: `Operator-made ${user.id}`, adminEmail: user.email });
    expect(await t.db('memberships').where({ user_id: user.id })).toHaveLength(4);
    for (let i = 1; i <= 3; i++) await create(cookie, `Saltmarsh Transect ${i}`).expect(201);
    await create(cookie, 'Saltmarsh Transect 4').expect(403);
  });

  it('raises the cap to 10 for an admin of a lab on a paid plan, and names that cap past it', async () => {
    const { user, cookie } = await person();
    const first = await create(cookie, 'Upland Stream Survey 1').expect(201);
    for (let i = 2; i <= 3; i++) await create(cookie, `Upland Stream Survey ${i}`).expect(201);
    await create(cookie, 'Upland Stream Survey 4').expect(403);
    const paid = await t.db('labs').where({ slug: first.body.lab.slug }).first('id');
    await onLargestPlan(t.db, Number(paid.id));
    for (let i = 4; i <= 10; i++) await create(cookie, `Upland Stream Survey ${i}`).expect(201);
    const refused = await create(cookie, 'Upland Stream Survey 11').expect(403);
    expect(refused.body.error).toEqual({
      code: 'lab_limit_reached',
      message: 'You have created 10 labs; an admin of a lab on a paid plan may create at most 10.',
    });
    expect(await createdBy(user.id)).toBe(10);
  });

  it('does not raise the cap for a paid lab the person is only a scientist in, or one whose subscription was cancelled', async () => {
    const { user, cookie } = await person();
    const paidElsewhere = await buildLab(t.db);
    await t.db('memberships').insert({ tenant_id: paidElsewhere.id, user_id: user.id, role: 'scientist' });
    await onLargestPlan(t.db, paidElsewhere.id);
    const cancelled = await buildLab(t.db);
    await t.db('memberships').insert({ tenant_id: cancelled.id, user_id: user.id, role: 'admin' });
    await onLargestPlan(t.db, cancelled.id);
    await t.db('lab_billing').where({ tenant_id: cancelled.id }).update({ status: 'canceled' });
    for (let i = 1; i <= 3; i++) await create(cookie, `Fen Hydrology ${i}`).expect(201);
    expect((await create(cookie, 'Fen Hydrology 4').expect(403)).body.error.message).toBe(FREE_CAP_MESSAGE);
  });

  it('holds under races: 8 creations at once by one person, 5 rounds, give exactly 3 labs', async () => {
    for (let round = 0; round < 5; round++) {
      const { user, cookie } = await person();
      const answers = await Promise.all(Array.from({ length: 8 }, (_, i) => create(cookie, `Race Meadow ${round}-${i}`)));
      expect(answers.map((a) => a.status).sort()).toEqual([201, 201, 201, 403, 403, 403, 403, 403]);
      expect(await createdBy(user.id)).toBe(3);
    }
  });

  it('gives different people asking for the same address at once each a lab of their own', async () => {
    const slug = `commons-${Date.now().toString(36)}`;
    const people = await Promise.all(Array.from({ length: 6 }, () => person()));
    const answers = await Promise.all(people.map((p) => request(t.app).post('/api/v1/labs').set('Cookie', p.cookie).send({ name: 'Commons', slug })));
    expect(answers.map((a) => a.status)).toEqual(new Array(6).fill(201));
    const slugs = answers.map((a) => a.body.lab.slug as string).sort();
    expect(new Set(slugs).size).toBe(6);
    expect(slugs).toEqual([slug, ...[2, 3, 4, 5, 6].map((n) => `${slug}-${n}`)].sort());
  });
});

describe('the creator backfill migration', () => {
  it("fills created_by_user_id from each lab's lab.created audit event, leaving operator-made labs empty", async () => {
    const { user } = await person();
    const older = await buildLab(t.db);
    const byOperator = await buildLab(t.db);
    await t.db('audit_events').insert([
      { tenant_id: older.id, id: older.id * 10 + 1, actor_user_id: user.id, action: 'lab.created', target_type: 'lab', target_id: older.slug, summary: 'made' },
      {
        tenant_id: byOperator.id,
        id: byOperator.id * 10 + 1,
        actor_user_id: null,
        action: 'lab.created',
        target_type: 'lab',
        target_id: byOperator.slug,
        summary: 'made',
      },
    ]);
    await backfillLabCreators(t.db);
    expect((await t.db('labs').where({ id: older.id }).first('created_by_user_id')).created_by_user_id).toBe(user.id);
    expect((await t.db('labs').where({ id: byOperator.id }).first('created_by_user_id')).created_by_user_id).toBeNull();
  });
});
