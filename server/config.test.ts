import { describe, expect, it } from 'vitest';
import { loadConfig } from './config.ts';
import { ConfigError } from './errors.ts';

const valid = {
  LAGBOOK_SESSION_SECRET: 'a'.repeat(32),
  OIDC_ISSUER: 'https://login.example.edu/realms/lab/',
  OIDC_CLIENT_ID: 'lagbook',
  OIDC_CLIENT_SECRET: 'secret',
  STRIPE_SECRET_KEY: 'sk_test_123',
  STRIPE_WEBHOOK_SECRET: 'whsec_123',
};

describe('loadConfig', () => {
  it('fills defaults and derives the redirect URI from the public URL', () => {
    const c = loadConfig({ ...valid, LAGBOOK_PUBLIC_URL: 'https://lagbook.example.org/' });
    expect(c.port).toBe(4310);
    expect(c.publicUrl).toBe('https://lagbook.example.org');
    expect(c.oidc.redirectUri).toBe('https://lagbook.example.org/auth/callback');
    expect(c.oidc.issuer).toBe('https://login.example.edu/realms/lab');
    expect(c.secureCookies).toBe(true);
  });

  it('reaches MariaDB over TCP by default and through its Unix socket when LAGBOOK_DB_SOCKET is set', () => {
    expect(loadConfig(valid).db).not.toHaveProperty('socketPath');
    expect(loadConfig({ ...valid, LAGBOOK_DB_SOCKET: '/run/mysqld/mysqld.sock' }).db.socketPath).toBe('/run/mysqld/mysqld.sock');
  });

  it("has no reader unless LAGBOOK_DB_READ_HOST and LAGBOOK_DB_READ_PORT are set; the reader takes the writer's user, database and pool size", () => {
    expect(loadConfig(valid).dbRead).toBeNull();
    const c = loadConfig({
      ...valid,
      LAGBOOK_DB_USER: 'lab',
      LAGBOOK_DB_PASSWORD: 'pw',
      LAGBOOK_DB_NAME: 'lagbook_a',
      LAGBOOK_DB_POOL_MAX: '7',
      LAGBOOK_DB_READ_HOST: '10.0.0.5',
      LAGBOOK_DB_READ_PORT: '4341',
    });
    expect(c.dbRead).toEqual({ host: '10.0.0.5', port: 4341, user: 'lab', password: 'pw', database: 'lagbook_a', poolMax: 7 });
    expect(loadConfig({ ...valid, LAGBOOK_DB_READ_HOST: 'r', LAGBOOK_DB_READ_PORT: '4341', LAGBOOK_DB_READ_POOL_MAX: '30' }).dbRead?.poolMax).toBe(30);
  });

  it('refuses half a reader setting and a reader pool size without a reader, naming the setting', () => {
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_HOST: '10.0.0.5' })).toThrow('LAGBOOK_DB_READ_PORT: required when LAGBOOK_DB_READ_HOST is set');
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_PORT: '4341' })).toThrow('LAGBOOK_DB_READ_HOST: required when LAGBOOK_DB_READ_PORT is set');
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_POOL_MAX: '5' })).toThrow(
      'LAGBOOK_DB_READ_POOL_MAX: set only together with LAGBOOK_DB_READ_HOST and LAGBOOK_DB_READ_PORT',
    );
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_HOST: 'r', LAGBOOK_DB_READ_PORT: '70000' })).toThrow(/LAGBOOK_DB_READ_PORT: /);
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_HOST: 'r', LAGBOOK_DB_READ_PORT: '4341', LAGBOOK_DB_READ_POOL_MAX: '0' })).toThrow(
      /LAGBOOK_DB_READ_POOL_MAX: /,
    );
    expect(() => loadConfig({ ...valid, LAGBOOK_DB_READ_HOST: '', LAGBOOK_DB_READ_PORT: '4341' })).toThrow(/LAGBOOK_DB_READ_HOST: /);
  });

  it('lists every missing setting at once, by name, without a stack of internals', () => {
    let message = '';
    try {
      loadConfig({});
    } catch (err) {
      expect(err).toBeInstanceOf(ConfigError);
      message = (err as Error).message;
    }
    expect(message).toBe(
      [
        'Invalid configuration:',
        '  LAGBOOK_SESSION_SECRET: required but not set',
        '  OIDC_ISSUER: required but not set',
        '  OIDC_CLIENT_ID: required but not set',
        '  OIDC_CLIENT_SECRET: required but not set',
        '  STRIPE_SECRET_KEY: required but not set',
        '  STRIPE_WEBHOOK_SECRET: required but not set',
      ].join('\n'),
    );
  });

  it('rejects malformed values with field: reason', () => {
    expect(() => loadConfig({ ...valid, LAGBOOK_PORT: 'eighty' })).toThrow(/LAGBOOK_PORT: /);
    expect(() => loadConfig({ ...valid, LAGBOOK_SESSION_SECRET: 'short' })).toThrow('LAGBOOK_SESSION_SECRET: must be at least 32 characters');
    expect(() => loadConfig({ ...valid, STRIPE_SECRET_KEY: 'pk_live_1' })).toThrow('STRIPE_SECRET_KEY: must start with sk_test_ or sk_live_');
  });

  it('refuses the Stripe stand-in in production', () => {
    expect(() => loadConfig({ ...valid, NODE_ENV: 'production', STRIPE_API_BASE: 'http://127.0.0.1:4312' })).toThrow(
      'STRIPE_API_BASE: the Stripe stand-in cannot be used in production',
    );
  });

  it('uses plain cookies on a plain-HTTP loopback URL', () => {
    expect(loadConfig(valid).secureCookies).toBe(false);
  });

  it('caps labs per account (3, 10 for admins of paid labs) and diagnostics runs per person (2) unless set', () => {
    expect(loadConfig(valid).labCreation).toEqual({ perAccount: 3, perPaidAdmin: 10 });
    expect(loadConfig(valid).diagnostics).toEqual({ runsPerPerson: 2 });
    const set = loadConfig({ ...valid, LAGBOOK_MAX_LABS_PER_ACCOUNT: '5', LAGBOOK_MAX_LABS_PER_PAID_ADMIN: '5', LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON: '4' });
    expect(set.labCreation).toEqual({ perAccount: 5, perPaidAdmin: 5 });
    expect(set.diagnostics).toEqual({ runsPerPerson: 4 });
    expect(() => loadConfig({ ...valid, LAGBOOK_MAX_LABS_PER_ACCOUNT: '0' })).toThrow('LAGBOOK_MAX_LABS_PER_ACCOUNT: must be at least 1');
    expect(() => loadConfig({ ...valid, LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON: 'many' })).toThrow(/LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON: /);
    expect(() => loadConfig({ ...valid, LAGBOOK_MAX_LABS_PER_ACCOUNT: '4', LAGBOOK_MAX_LABS_PER_PAID_ADMIN: '3' })).toThrow(
      'LAGBOOK_MAX_LABS_PER_PAID_ADMIN: must be at least LAGBOOK_MAX_LABS_PER_ACCOUNT (4)',
    );
  });
});
