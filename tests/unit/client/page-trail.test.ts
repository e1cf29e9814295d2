import { describe, expect, it } from 'vitest';
import { cursorBefore, PAGE_TRAIL_MAX, rememberPage } from '../../../client/features/runs/utils/page-trail.ts';

/** A Storage over a Map (the module takes the tab's sessionStorage in the browser). */
function memoryStorage(): Storage {
  const items = new Map<string, string>();
  return {
    get length() {
      return items.size;
    },
    clear: () => items.clear(),
    getItem: (key) => items.get(key) ?? null,
    key: (index) => [...items.keys()][index] ?? null,
    removeItem: (key) => void items.delete(key),
    setItem: (key, value) => void items.set(key, value),
  };
}

describe('runs list page trail (keyset "newer" links)', () => {
  it('walks back through the pages it saw: page 3 → cursor of page 2 → page 1 by number', () => {
    const storage = memoryStorage();
    rememberPage('cursor-after-1', undefined, storage); // page 1 (by number) is followed by the page at cursor-after-1
    rememberPage('cursor-after-2', 'cursor-after-1', storage); // page 2 is followed by the page at cursor-after-2
    expect(cursorBefore('cursor-after-2', storage)).toBe('cursor-after-1');
    expect(cursorBefore('cursor-after-1', storage)).toBeUndefined();
  });

  it('a page this tab has not seen (a shared link) has no cursor before it: the link falls back to the number', () => {
    const storage = memoryStorage();
    rememberPage('seen', undefined, storage);
    expect(cursorBefore('never-seen', storage)).toBeUndefined();
    expect(cursorBefore(undefined, storage)).toBeUndefined();
  });

  it(`keeps the newest ${PAGE_TRAIL_MAX} pages and forgets the oldest`, () => {
    const storage = memoryStorage();
    for (let i = 0; i <= PAGE_TRAIL_MAX; i++) rememberPage(`c${i + 1}`, `c${i}`, storage);
    expect(cursorBefore('c1', storage)).toBeUndefined(); // the first one remembered went first
    expect(cursorBefore('c2', storage)).toBe('c1');
    expect(cursorBefore(`c${PAGE_TRAIL_MAX + 1}`, storage)).toBe(`c${PAGE_TRAIL_MAX}`);
    expect(Object.keys(JSON.parse(storage.getItem('pacewright.runs-page-trail')!) as object)).toHaveLength(PAGE_TRAIL_MAX);
  });

  it('a damaged stored trail or a full storage only loses the way back, never throws', () => {
    const storage = memoryStorage();
    storage.setItem('pacewright.runs-page-trail', '{not json');
    expect(cursorBefore('x', storage)).toBeUndefined();
    const full = {
      ...memoryStorage(),
      getItem: () => null,
      setItem: () => {
        throw new Error('QuotaExceededError');
      },
    } as Storage;
    expect(() => rememberPage('a', 'b', full)).not.toThrow();
    expect(() => rememberPage('a', 'b', undefined)).not.toThrow();
  });
});
