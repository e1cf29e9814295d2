import { describe, expect, it } from 'vitest';
import {
  importIdOfArchive,
  parseOriginalKey,
  selectLeftoverArchives,
  selectOrphanOriginals,
  type ImportStatus,
  type StoredFileInfo,
} from '../../../../shared/runs/orphan-files.ts';

const NOW = new Date('2026-03-01T12:00:00Z');
const GRACE_S = 600;
const USER = '0b6f1c2e-8d4a-4e59-9a51-3c7d2f10a9b4';
const SHA_A = 'a'.repeat(64);
const SHA_B = 'b'.repeat(64);
const IMPORT_ID = '5f0e8a1c-2b3d-4c6e-8f90-1a2b3c4d5e6f';

const secondsAgo = (s: number) => new Date(NOW.getTime() - s * 1000);
const file = (key: string, ageSeconds: number): StoredFileInfo => ({ key, modifiedAt: secondsAgo(ageSeconds) });

describe('parseOriginalKey / importIdOfArchive', () => {
  it.each<[string, { userId: string; sha256: string } | null]>([
    [`${USER}/${SHA_A}`, { userId: USER, sha256: SHA_A }],
    [`${USER}/${SHA_A}.tmp`, null],
    [`${USER}/${'A'.repeat(64)}`, null], // the app writes lower-case hex only
    [`not-a-user/${SHA_A}`, null],
    [`${USER}/nested/${SHA_A}`, null],
    ['README.txt', null],
    ['', null],
  ])('%s → %o', (key, expected) => {
    expect(parseOriginalKey(key)).toEqual(expected);
  });

  it.each<[string, string | null]>([
    [`${IMPORT_ID}.zip`, IMPORT_ID],
    [`upload-${IMPORT_ID}.part`, null],
    [`${IMPORT_ID}.zip.bak`, null],
    ['history.zip', null],
  ])('archive name %s → %s', (name, expected) => {
    expect(importIdOfArchive(name)).toBe(expected);
  });
});

describe('selectOrphanOriginals', () => {
  const referenced = new Set([`${USER}/${SHA_A}`]);

  it.each<[string, StoredFileInfo, boolean]>([
    ['an old file with no row', file(`${USER}/${SHA_B}`, 3600), true],
    ['an old file whose row exists', file(`${USER}/${SHA_A}`, 3600), false],
    ['a file with no row still inside the grace period', file(`${USER}/${SHA_B}`, 60), false],
    ['a file exactly at the end of the grace period', file(`${USER}/${SHA_B}`, GRACE_S), false],
    ['a file one second past the grace period', file(`${USER}/${SHA_B}`, GRACE_S + 1), true],
    ['a file dated in the future (skewed clock)', file(`${USER}/${SHA_B}`, -3600), false],
    ['a file with an unreadable time', { key: `${USER}/${SHA_B}`, modifiedAt: new Date(Number.NaN) }, false],
    ['an old file the app never writes', file('notes/README.txt', 3600), false],
  ])('%s → removed: %s', (_label, stored, removed) => {
    expect(selectOrphanOriginals([stored], referenced, NOW, GRACE_S)).toEqual(removed ? [stored.key] : []);
  });

  it('keeps the listing order and picks only the orphans out of a mixed batch', () => {
    const shaC = 'c'.repeat(64);
    const stored = [file(`${USER}/${SHA_B}`, 9000), file(`${USER}/${SHA_A}`, 9000), file(`${USER}/${shaC}`, 7200)];
    expect(selectOrphanOriginals(stored, referenced, NOW, GRACE_S)).toEqual([`${USER}/${SHA_B}`, `${USER}/${shaC}`]);
  });

  it('with a grace of 0 every file without a row that is not from the future is an orphan', () => {
    expect(selectOrphanOriginals([file(`${USER}/${SHA_B}`, 1)], new Set(), NOW, 0)).toEqual([`${USER}/${SHA_B}`]);
  });

  it('an empty store has no orphans', () => {
    expect(selectOrphanOriginals([], referenced, NOW, GRACE_S)).toEqual([]);
  });

  it.each([-1, Number.NaN, Number.POSITIVE_INFINITY])('refuses a grace period of %s', (grace) => {
    expect(() => selectOrphanOriginals([], referenced, NOW, grace)).toThrow(RangeError);
  });
});

describe('selectLeftoverArchives', () => {
  const archive = `${IMPORT_ID}.zip`;
  const statuses = (status?: ImportStatus) => new Map<string, ImportStatus>(status ? [[IMPORT_ID, status]] : []);

  it.each<[string, StoredFileInfo, ImportStatus | undefined, boolean]>([
    ['an old archive without an import row', file(archive, 3600), undefined, true],
    ['an old archive of a finished import', file(archive, 3600), 'done', true],
    ['an old archive of a failed import', file(archive, 3600), 'failed', true],
    ['an old archive of a queued import', file(archive, 3600), 'queued', false],
    ['an old archive of an import in progress', file(archive, 3600), 'running', false],
    ['a new archive without an import row (its row is being written)', file(archive, 30), undefined, false],
    ['an old half-received upload', file(`upload-${IMPORT_ID}.part`, 3600), undefined, true],
    ['a half-received upload still arriving', file(`upload-${IMPORT_ID}.part`, 5), undefined, false],
    ['an old file the app never writes', file('keep-me.txt', 3600), undefined, false],
  ])('%s → removed: %s', (_label, stored, status, removed) => {
    expect(selectLeftoverArchives([stored], statuses(status), NOW, GRACE_S)).toEqual(removed ? [stored.key] : []);
  });

  it('refuses a negative grace period', () => {
    expect(() => selectLeftoverArchives([], new Map(), NOW, -5)).toThrow(RangeError);
  });
});
