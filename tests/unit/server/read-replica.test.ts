import { describe, expect, it } from 'vitest';
import { ConfigError, DEFAULT_REPLICA_MAX_LAG_MS, loadConfig } from '../../../server/config.ts';
import { asRecordEnd, parseLsn } from '../../../server/lib/read-replica.ts';

const KIB8 = 8192n;
const MIB16 = 16n * 1024n * 1024n;

describe('WAL positions', () => {
  it('reads an LSN as its two 32-bit hex halves, so positions compare as numbers', () => {
    // PostgreSQL's pg_lsn text form is %X/%X of the high and low 32 bits (src/backend/utils/adt/pg_lsn.c).
    expect(parseLsn('0/3000028')).toBe(0x3000028n);
    expect(parseLsn('16/B374D848')).toBe((0x16n << 32n) + 0xb374d848n);
    expect(parseLsn('1/0') > parseLsn('0/FFFFFFFF')).toBe(true);
    expect(() => parseLsn('3000028')).toThrow();
  });

  it('takes an insert position just past a page header as the page boundary a caught-up replica reports', () => {
    // Seen on this machine: an idle primary answered pg_current_wal_insert_lsn() = 0/3000028 while its fresh
    // replica answered pg_last_wal_replay_lsn() = 0/3000000; XLogBytePosToRecPtr skips the page header
    // (SizeOfXLogLongPHD 40 bytes at a segment start, SizeOfXLogShortPHD 24 elsewhere; access/xlog_internal.h).
    expect(asRecordEnd(parseLsn('0/3000028'), KIB8, MIB16)).toBe(parseLsn('0/3000000'));
    expect(asRecordEnd(parseLsn('0/3002018'), KIB8, MIB16)).toBe(parseLsn('0/3002000'));
    // Anywhere else the position is a record end already.
    expect(asRecordEnd(parseLsn('0/3002030'), KIB8, MIB16)).toBe(parseLsn('0/3002030'));
    expect(asRecordEnd(parseLsn('0/3002028'), KIB8, MIB16)).toBe(parseLsn('0/3002028'));
    expect(asRecordEnd(parseLsn('0/3000018'), KIB8, MIB16)).toBe(parseLsn('0/3000018'));
  });
});

describe('replica settings', () => {
  it('has no replica unless DATABASE_REPLICA_URL is set, and a 2 s lag bound by default', () => {
    expect(loadConfig({}).replica).toBeNull();
    expect(loadConfig({ DATABASE_REPLICA_URL: 'postgres://u@replica/pw' }).replica).toEqual({
      url: 'postgres://u@replica/pw',
      maxLagMs: DEFAULT_REPLICA_MAX_LAG_MS,
    });
    expect(DEFAULT_REPLICA_MAX_LAG_MS).toBe(2_000);
    expect(loadConfig({ DATABASE_REPLICA_URL: 'postgres://r/pw', DATABASE_REPLICA_MAX_LAG_MS: '500' }).replica?.maxLagMs).toBe(
      500,
    );
  });

  it.each(['0', '-1', '1.5', 'soon'])('refuses DATABASE_REPLICA_MAX_LAG_MS=%s with a sentence', (value) => {
    expect(() => loadConfig({ DATABASE_REPLICA_MAX_LAG_MS: value })).toThrow(
      /DATABASE_REPLICA_MAX_LAG_MS must be a whole number/,
    );
    expect(() => loadConfig({ DATABASE_REPLICA_MAX_LAG_MS: value })).toThrow(ConfigError);
  });
});
