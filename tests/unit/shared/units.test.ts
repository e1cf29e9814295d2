import { describe, expect, it } from 'vitest';
import { formatFileSize } from '../../../shared/units.ts';

describe('formatFileSize', () => {
  it.each([
    [1024 ** 3, '1 GB'],
    [1.5 * 1024 ** 3, '1.5 GB'],
    [50 * 1024 ** 2, '50 MB'],
    [1024 ** 2 - 1, '1024 KB'],
    [800 * 1024, '800 KB'],
    [1000, '1000 bytes'],
    [0, '0 bytes'],
  ])('%d bytes reads "%s"', (bytes, words) => {
    expect(formatFileSize(bytes)).toBe(words);
  });
});
