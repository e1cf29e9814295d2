import { describe, expect, it } from 'vitest';
import { SpareColumns } from '../../../../shared/tracks/spare-columns.ts';

describe('SpareColumns (spent room of one analysis handed out again)', () => {
  it('hands out given room as zeroed columns of its length, and fresh ones once it is used up', () => {
    const spare = new SpareColumns(3);
    const room = Float64Array.from([1, 2, 3, 4, 5, 6, 7]);
    spare.give(room);
    const a = spare.take();
    const b = spare.take();
    // Whatever the room held, a taken column reads as a fresh one.
    expect([...a]).toEqual([0, 0, 0]);
    expect([...b]).toEqual([0, 0, 0]);
    // Carved from the given room (no fresh memory), without overlapping each other.
    expect(a.buffer).toBe(room.buffer);
    expect(b.buffer).toBe(room.buffer);
    expect(Math.abs(a.byteOffset - b.byteOffset)).toBe(3 * 8);
    // The 7th number is a remainder shorter than a column: not handed out.
    const c = spare.take();
    expect(c.buffer).not.toBe(room.buffer);
    expect([...c]).toEqual([0, 0, 0]);
  });

  it('lays 32-bit integer columns over one zeroed Float64 column', () => {
    const spare = new SpareColumns(4);
    spare.give(Float64Array.from([9, 9, 9, 9]));
    const { ints, room } = spare.takeInt32();
    expect(ints.length).toBe(4);
    expect([...ints]).toEqual([0, 0, 0, 0]);
    expect(ints.buffer).toBe(room.buffer);
  });

  it('takes nothing from an empty track', () => {
    const spare = new SpareColumns(0);
    spare.give(new Float64Array(5));
    expect(spare.take().length).toBe(0);
  });
});
