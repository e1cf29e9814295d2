import { describe, expect, it } from 'vitest';
import { decodeRunListCursor, encodeRunListCursor, type RunListCursor } from '../../../../shared/runs/list-cursor.ts';

const ID = '5d16199e-7cb0-41e4-96cf-f1ab3178ec04';

describe('runs list cursor', () => {
  it('reads back exactly what it wrote, for each sort (PostgreSQL text of the key, null pace)', () => {
    const cursors: RunListCursor[] = [
      { sort: 'date', order: 'desc', key: '2024-03-19 06:33:00.000731+00', id: ID },
      { sort: 'date', order: 'asc', key: '2024-03-19 08:33:00+02', id: ID },
      { sort: 'distance', order: 'desc', key: '21097.5', id: ID },
      { sort: 'duration', order: 'asc', key: '1500', id: ID },
      { sort: 'pace', order: 'asc', key: '0.30000000000000004', id: ID },
      { sort: 'pace', order: 'desc', key: null, id: ID },
    ];
    for (const cursor of cursors) {
      const text = encodeRunListCursor(cursor);
      expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
      expect(decodeRunListCursor(text)).toEqual(cursor);
    }
  });

  it('refuses damaged, edited, foreign or overlong text', () => {
    const good = encodeRunListCursor({ sort: 'date', order: 'desc', key: '2024-03-19 06:33:00+00', id: ID });
    const raw = (value: unknown) => Buffer.from(JSON.stringify(value)).toString('base64url');
    for (const bad of [
      '',
      'not a cursor',
      good.slice(0, -3),
      `${good}=`,
      'A'.repeat(301),
      raw([2, 'date', 'desc', '2024-03-19 06:33:00+00', ID]),
      raw([1, 'heart_rate', 'desc', '1', ID]),
      raw([1, 'date', 'sideways', '2024-03-19 06:33:00+00', ID]),
      raw([1, 'date', 'desc', '2024-03-19', ID]),
      raw([1, 'date', 'desc', null, ID]),
      raw([1, 'distance', 'desc', '1 or 1=1', ID]),
      raw([1, 'distance', 'desc', '5000', 'not-a-uuid']),
      raw({ sort: 'date' }),
    ]) {
      expect({ bad, cursor: decodeRunListCursor(bad) }).toEqual({ bad, cursor: null });
    }
  });
});
