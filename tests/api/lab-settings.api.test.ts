import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import type { LabExportSettings } from '../../server/contract/labs.ts';

/**
 * Lab settings: admins rename a lab and describe it (the address stays), and download the full
 * export — lab.json and one readings CSV per channel in one zip. The zip is read back with
 * Python's standard `zipfile` module (an independent reader), the CSV rows compared with the
 * readings stored in the database.
 */
let t: TestApp;
let f: LabWithEverything;
let cookie: string;
const path = (p = '') => `/api/v1/labs/${f.lab.slug}${p}`;

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db, { name: 'Lower meadow plots', rowInEveryTable: true });
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
});
afterAll(async () => t.close());

const labRow = () => t.db('labs').where({ id: f.lab.id }).first('slug', 'name', 'description');
const auditOf = (action: string) => t.db('audit_events').where({ tenant_id: f.lab.id, action }).orderBy('at');

describe('rename and describe', () => {
  it('an admin renames the lab and sets its description; the address stays and the change is audit-logged', async () => {
    const res = await request(t.app)
      .patch(path())
      .set('Cookie', cookie)
      .send({ name: '  Lower meadow field station  ', description: 'Air and soil plots by the river.\nLogger cabinet in hut 2.' })
      .expect(200);
    expect(res.body.lab).toMatchObject({
      slug: f.lab.slug,
      name: 'Lower meadow field station',
      description: 'Air and soil plots by the river.\nLogger cabinet in hut 2.',
    });
    expect(res.body.role).toBe('admin');
    expect(await labRow()).toEqual({
      slug: f.lab.slug,
      name: 'Lower meadow field station',
      description: 'Air and soil plots by the river.\nLogger cabinet in hut 2.',
    });
    const got = await request(t.app).get(path()).set('Cookie', cookie).expect(200);
    expect(got.body.lab.description).toBe('Air and soil plots by the river.\nLogger cabinet in hut 2.');
    const [event] = await auditOf('lab.updated');
    expect(event.summary).toContain('renamed the lab from "Lower meadow plots" to "Lower meadow field station" and changed its description');
    expect(event.details).toMatchObject({ name: { from: 'Lower meadow plots', to: 'Lower meadow field station' } });
    // the lab list shows the new name at the same address
    const me = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(me.body.labs).toEqual([expect.objectContaining({ slug: f.lab.slug, name: 'Lower meadow field station' })]);
  });

  it('the description alone can change, and an unchanged value writes no audit event', async () => {
    const before = (await auditOf('lab.updated')).length;
    await request(t.app).patch(path()).set('Cookie', cookie).send({ description: '' }).expect(200);
    expect((await labRow()).description).toBe('');
    await request(t.app).patch(path()).set('Cookie', cookie).send({ name: 'Lower meadow field station' }).expect(200);
    expect(await auditOf('lab.updated')).toHaveLength(before + 1);
  });

  it.each([
    ['an empty name', { name: ' ' }, 'Lab name: must be at least 2 characters.'],
    ['a 121-character name', { name: 'x'.repeat(121) }, 'Lab name: must be at most 120 characters.'],
    ['a 1,001-character description', { description: 'y'.repeat(1001) }, 'Description: must be at most 1000 characters.'],
    ['a control character', { description: 'bell\u0007' }, 'Description: must be plain text (no control characters).'],
    ['nothing to change', {}, 'Lab name: give a new name or a new description.'],
    ['a number as name', { name: 42 }, 'Lab name: must be text.'],
  ])('refuses %s with 400 and changes nothing', async (_label, body, message) => {
    const before = await labRow();
    const res = await request(t.app).patch(path()).set('Cookie', cookie).send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
    expect(await labRow()).toEqual(before);
  });

  it('technicians, scientists and guests may not rename (403), and the lab is unchanged', async () => {
    const before = await labRow();
    for (const role of ['technician', 'scientist', 'guest'] as const) {
      const member = await buildMember(t.db, f.lab, { role });
      const c = await sessionCookieFor(t.db, t.config.sessionSecret, member.id);
      const res = await request(t.app).patch(path()).set('Cookie', c).send({ name: 'Taken over' });
      expect(res.status, role).toBe(403);
      expect((await request(t.app).get(path('/export.zip')).set('Cookie', c)).status, role).toBe(403);
    }
    expect(await labRow()).toEqual(before);
  });
});

/** Reads a zip's entries with Python's zipfile module: name → text. */
function unzip(bytes: Buffer): Record<string, string> {
  const file = join(mkdtempSync(join(tmpdir(), 'lagbook-export-')), 'export.zip');
  writeFileSync(file, bytes);
  const script =
    'import json, sys, zipfile\nz = zipfile.ZipFile(sys.argv[1])\nassert z.testzip() is None\nprint(json.dumps({n: z.read(n).decode("utf-8") for n in z.namelist()}))';
  return JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, file], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 })) as Record<string, string>;
}

/** A supertest parser that keeps the body as bytes (superagent hands the raw response stream in). */
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('full export', () => {
  it('streams one zip with lab.json (settings) and one readings CSV per channel equal to the stored readings', async () => {
    // a second channel with 25,003 readings: more than two of the export's 10,000-reading pages
    const second = f.ids.channelId + 1;
    await t.db('channels').insert({ tenant_id: f.lab.id, id: second, logger_id: f.ids.loggerId, channel_key: 'soil_m', label: 'Soil moisture', unit: '%' });
    const t0 = Date.UTC(2026, 5, 1);
    const many = Array.from({ length: 25_003 }, (_, i) => ({
      tenant_id: f.lab.id,
      channel_id: second,
      ts: t0 + i * 60_000,
      value: Math.round(Math.sin(i / 50) * 1e6) / 1e4,
    }));
    for (let i = 0; i < many.length; i += 5000) await t.db('readings').insert(many.slice(i, i + 5000));

    const res = await request(t.app).get(path('/export.zip')).set('Cookie', cookie).buffer(true).parse(binary).expect(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(new RegExp(`^attachment; filename="${f.lab.slug}-export-\\d{4}-\\d{2}-\\d{2}\\.zip"$`));
    const files = unzip(res.body as Buffer);

    const settings = JSON.parse(files['lab.json']) as LabExportSettings;
    expect(settings.format).toBe('lagbook-lab-export/1');
    expect(settings.lab).toMatchObject({ slug: f.lab.slug, name: 'Lower meadow field station' });
    expect(settings.members.map((m) => [m.email, m.role]).sort()).toEqual(
      (
        await t
          .db('memberships')
          .join('users', 'users.id', 'memberships.user_id')
          .where('memberships.tenant_id', f.lab.id)
          .select('users.email', 'memberships.role')
      )
        .map((r: { email: string; role: string }) => [r.email, r.role])
        .sort(),
    );
    expect(settings.loggers.map((l) => l.id)).toEqual([f.ids.loggerId]);
    expect(settings.channels.map((c) => [c.id, c.key, c.readingsFile])).toEqual([
      [f.ids.channelId, 'air_t', `readings/logger-${f.ids.loggerId}/air_t.csv`],
      [second, 'soil_m', `readings/logger-${f.ids.loggerId}/soil_m.csv`],
    ]);
    expect(settings.channels[0]).toMatchObject({ label: 'Air temperature', unit: '°C' });
    expect(settings.alertRules).toEqual([
      expect.objectContaining({ id: f.ids.ruleId, name: 'Air too warm', kind: 'bounds', params: { low: null, high: 30, holdS: 0 } }),
    ]);
    // the fixture's note (a probe cleaning on the channel, left out of analysis)
    expect(settings.notes).toEqual([
      expect.objectContaining({
        id: f.ids.noteId,
        channelId: f.ids.channelId,
        text: 'Probe cleaned',
        excludeFromAnalysis: true,
        kind: expect.objectContaining({ name: 'maintenance' }),
      }),
    ]);
    expect(Object.keys(files).sort()).toEqual([
      'ABOUT.txt',
      'lab.json',
      `readings/logger-${f.ids.loggerId}/air_t.csv`,
      `readings/logger-${f.ids.loggerId}/soil_m.csv`,
    ]);

    for (const c of settings.channels) {
      const stored: Array<{ ts: number; value: number }> = await t
        .db('readings')
        .where({ tenant_id: f.lab.id, channel_id: c.id })
        .orderBy('ts')
        .select('ts', 'value');
      const lines = files[c.readingsFile].split('\r\n');
      expect(lines.at(-1)).toBe('');
      expect(lines[0]).toBe('time_utc,epoch_ms,value');
      const rows = lines.slice(1, -1).map((l) => l.split(','));
      expect(rows).toHaveLength(stored.length);
      expect(rows.map(([, ms, v]) => [Number(ms), Number(v)])).toEqual(stored.map((r) => [Number(r.ts), r.value]));
      expect(rows.every(([iso, ms]) => iso === new Date(Number(ms)).toISOString())).toBe(true);
    }
    expect(files[settings.channels[1].readingsFile].split('\r\n')).toHaveLength(25_003 + 2);
    const [event] = await auditOf('lab.exported');
    expect(event.details).toMatchObject({ channels: 2, loggers: 1, notes: 1 });
  });

  it('answers 404 for a lab the admin does not belong to, 401 signed out', async () => {
    const other = await buildLabWithEverything(t.db);
    expect((await request(t.app).get(`/api/v1/labs/${other.lab.slug}/export.zip`).set('Cookie', cookie)).status).toBe(404);
    expect((await request(t.app).get(path('/export.zip'))).status).toBe(401);
  });
});
