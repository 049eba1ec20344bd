import { describe, expect, it } from 'vitest';
import knex from 'knex';
import { bindLab, inLab, LAB_OWNED_TABLES } from './tenant-scope.ts';

// A query builder that never connects: enough to read the SQL and bindings a scope produces.
const offline = knex({ client: 'mysql2' });

describe('bindLab', () => {
  it('puts the lab id where :lab stands and keeps the other bindings in order around it', () => {
    const out = bindLab('SELECT ts - MOD(ts, ?) FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts < ?', [60_000, 7, 99], 42);
    expect(out.sql).toBe('SELECT ts - MOD(ts, ?) FROM readings WHERE tenant_id = ? AND channel_id = ? AND ts < ?');
    expect(out.bindings).toEqual([60_000, 42, 7, 99]);
  });

  it('binds every :lab of a statement (a join names the lab on both sides)', () => {
    const out = bindLab(
      'UPDATE channels c JOIN readings r ON r.channel_id = c.id SET c.x = ? WHERE c.tenant_id = :lab AND r.tenant_id = :lab AND r.ts = ?',
      ['x', 5],
      3,
    );
    expect(out.sql).toBe('UPDATE channels c JOIN readings r ON r.channel_id = c.id SET c.x = ? WHERE c.tenant_id = ? AND r.tenant_id = ? AND r.ts = ?');
    expect(out.bindings).toEqual(['x', 3, 3, 5]);
  });

  it("counts knex's ?? (identifier) as one binding and leaves an escaped \\? alone", () => {
    const out = bindLab('SELECT ?? FROM readings WHERE tenant_id = :lab AND note = "\\?" AND channel_id = ?', ['value', 8], 1);
    expect(out.sql).toBe('SELECT ?? FROM readings WHERE tenant_id = ? AND note = "\\?" AND channel_id = ?');
    expect(out.bindings).toEqual(['value', 1, 8]);
  });

  it('does not take a word that merely starts with :lab for the placeholder', () => {
    expect(() => bindLab('SELECT :label FROM readings', [], 1)).toThrow('scope.raw: the statement must name the lab as :lab');
  });

  it('refuses a statement that never names the lab', () => {
    expect(() => bindLab('SELECT ts FROM readings WHERE channel_id = ?', [1], 1)).toThrow('scope.raw: the statement must name the lab as :lab');
  });

  it('refuses a tenant column compared with a hand-passed value', () => {
    expect(() => bindLab('SELECT ts FROM readings WHERE tenant_id = ? AND x = :lab', [2], 1)).toThrow(
      'scope.raw: compare tenant_id with :lab, not with a bound value',
    );
    expect(() => bindLab('SELECT ts FROM readings r WHERE r.tenant_id IN (?) AND x = :lab', [2], 1)).toThrow('scope.raw: compare tenant_id with :lab');
  });

  it('refuses too few or too many bindings', () => {
    expect(() => bindLab('SELECT ts FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts = ?', [1], 1)).toThrow(
      'scope.raw: the statement has more placeholders than the 1 binding(s) given',
    );
    expect(() => bindLab('SELECT ts FROM readings WHERE tenant_id = :lab AND channel_id = ?', [1, 2], 1)).toThrow(
      'scope.raw: 2 binding(s) given for 1 placeholder(s)',
    );
  });
});

describe('inLab', () => {
  it('refuses an id that is not a positive safe integer', () => {
    for (const bad of [0, -1, 1.5, Number.NaN, 2 ** 53]) expect(() => inLab(offline, bad)).toThrow('inLab: tenantId must be a positive integer');
  });

  it('limits table queries to the lab and stamps inserts with its id, whatever tenant_id the row names', () => {
    const scope = inLab(offline, 9);
    expect(scope.table('loggers').select('loggers.id').toSQL().toNative()).toEqual({
      sql: 'select `loggers`.`id` from `loggers` where `loggers`.`tenant_id` = ?',
      bindings: [9],
    });
    expect(scope.insert('loggers', { id: 1, tenant_id: 4 }).toSQL().toNative().bindings).toEqual([1, 9]);
  });

  it('runs raw statements with the lab bound and carries its connection', () => {
    const scope = inLab(offline, 12);
    expect(scope.db).toBe(offline);
    expect(scope.raw('SELECT 1 FROM readings WHERE tenant_id = :lab AND channel_id = ?', [5]).toSQL().toNative()).toEqual({
      sql: 'SELECT 1 FROM readings WHERE tenant_id = ? AND channel_id = ?',
      bindings: [12, 5],
    });
  });
});

describe('LAB_OWNED_TABLES', () => {
  it('lists each table once', () => {
    expect(new Set(LAB_OWNED_TABLES).size).toBe(LAB_OWNED_TABLES.length);
  });
});
