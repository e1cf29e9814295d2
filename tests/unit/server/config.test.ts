import { describe, expect, it } from 'vitest';
import { ConfigError, DEFAULT_COMPUTE_NICE, loadConfig } from '../../../server/config.ts';

describe('loadConfig', () => {
  it.each([
    ['missing', undefined],
    ['empty', ''],
    ['a well-known placeholder', 'changeme'],
    ['too short', 'abc123'],
  ])('refuses to start in production when JWT_SECRET is %s', (_label, secret) => {
    expect(() => loadConfig({ NODE_ENV: 'production', JWT_SECRET: secret })).toThrow(ConfigError);
  });

  it('accepts a long random secret in production and uses secure cookies settings', () => {
    const config = loadConfig({ NODE_ENV: 'production', JWT_SECRET: 'f'.repeat(16) + '0123456789abcdef0123' });
    expect(config.env).toBe('production');
  });

  it('outside production makes up a random secret per process', () => {
    const a = loadConfig({});
    const b = loadConfig({});
    expect(a.jwtSecret).toHaveLength(64);
    expect(a.jwtSecret).not.toBe(b.jwtSecret);
  });

  it('hashes passwords with a bcrypt cost of at least 10 by default', () => {
    expect(loadConfig({}).bcryptCost).toBeGreaterThanOrEqual(10);
  });

  it('reads PORT, HOST, PGPORT and DATABASE_URL (api-contract.md defaults 3000, 127.0.0.1, 54329)', () => {
    expect(loadConfig({})).toMatchObject({
      port: 3000,
      host: '127.0.0.1',
      databaseUrl: 'postgres://postgres@127.0.0.1:54329/pacewright',
    });
    expect(loadConfig({ PORT: '8080', HOST: '0.0.0.0', PGPORT: '6000' })).toMatchObject({
      port: 8080,
      host: '0.0.0.0',
      databaseUrl: 'postgres://postgres@127.0.0.1:6000/pacewright',
    });
    expect(loadConfig({ DATABASE_URL: 'postgres://u@db.internal/pw' }).databaseUrl).toBe('postgres://u@db.internal/pw');
  });

  it('keeps unreferenced stored files for 10 minutes unless ORPHAN_GRACE_SECONDS says otherwise', () => {
    expect(loadConfig({}).orphanGraceSeconds).toBe(600);
    expect(loadConfig({ ORPHAN_GRACE_SECONDS: '' }).orphanGraceSeconds).toBe(600);
    expect(loadConfig({ ORPHAN_GRACE_SECONDS: '3600' }).orphanGraceSeconds).toBe(3600);
    expect(loadConfig({ ORPHAN_GRACE_SECONDS: '0' }).orphanGraceSeconds).toBe(0);
    for (const bad of ['-1', '10m', '1.5', ' 60'])
      expect(() => loadConfig({ ORPHAN_GRACE_SECONDS: bad })).toThrow(/ORPHAN_GRACE_SECONDS must be a whole number/);
  });

  it('runs the compute threads DEFAULT_COMPUTE_NICE below the event loop unless COMPUTE_NICE (0–19) says otherwise', () => {
    expect(loadConfig({}).computeNice).toBe(DEFAULT_COMPUTE_NICE);
    expect(loadConfig({ COMPUTE_NICE: '' }).computeNice).toBe(DEFAULT_COMPUTE_NICE);
    expect(loadConfig({ COMPUTE_NICE: '0' }).computeNice).toBe(0);
    expect(loadConfig({ COMPUTE_NICE: '19' }).computeNice).toBe(19);
    for (const bad of ['-5', '20', '2.5', ' 5', 'low'])
      expect(() => loadConfig({ COMPUTE_NICE: bad })).toThrow(/COMPUTE_NICE must be a whole number from 0/);
  });

  it('gives bulk-import work a 60 s lease and 3 attempts unless IMPORT_LEASE_SECONDS / IMPORT_MAX_ATTEMPTS say otherwise', () => {
    expect(loadConfig({}).importLease).toEqual({ leaseSeconds: 60, maxAttempts: 3 });
    expect(loadConfig({ IMPORT_LEASE_SECONDS: '8', IMPORT_MAX_ATTEMPTS: '5' }).importLease).toEqual({
      leaseSeconds: 8,
      maxAttempts: 5,
    });
    for (const bad of ['0', '1', '-5', '1.5', '10s'])
      expect(() => loadConfig({ IMPORT_LEASE_SECONDS: bad })).toThrow(
        /IMPORT_LEASE_SECONDS must be a whole number of seconds \(2 or more\)/,
      );
    for (const bad of ['0', 'three', '2.5'])
      expect(() => loadConfig({ IMPORT_MAX_ATTEMPTS: bad })).toThrow(/IMPORT_MAX_ATTEMPTS must be a whole number/);
  });
});

describe('DIGEST_SCHEDULE', () => {
  it('defaults to Monday 06:00 UTC, reads "off" as no schedule, keeps a five-field cron text', () => {
    expect(loadConfig({}).digestSchedule).toBe('0 6 * * 1');
    expect(loadConfig({ DIGEST_SCHEDULE: '' }).digestSchedule).toBe('0 6 * * 1');
    expect(loadConfig({ DIGEST_SCHEDULE: 'off' }).digestSchedule).toBeNull();
    expect(loadConfig({ DIGEST_SCHEDULE: ' OFF ' }).digestSchedule).toBeNull();
    expect(loadConfig({ DIGEST_SCHEDULE: '30  17 * *  sun' }).digestSchedule).toBe('30 17 * * sun');
    expect(loadConfig({ DIGEST_SCHEDULE: '*/15 6-8 1,15 * 1-5' }).digestSchedule).toBe('*/15 6-8 1,15 * 1-5');
  });

  it.each([['every monday'], ['0 6 * *'], ['0 0 6 * * 1'], ['0 6 * * 1; rm'], ['x'.repeat(101)]])(
    'refuses "%s" with a sentence naming the variable',
    (text) => {
      expect(() => loadConfig({ DIGEST_SCHEDULE: text })).toThrow(/DIGEST_SCHEDULE must be "off" or a cron text of five fields/);
    },
  );
});
