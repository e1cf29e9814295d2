import { describe, expect, it } from 'vitest';
import { CONTROL_CHARACTER_MESSAGE, controlCharacterIssues } from '../../../../shared/api/text.ts';

const isFreeOfControlCharacters = (text: string) => controlCharacterIssues({ text }).length === 0;

// Unicode's general category Cc (the Unicode Standard, ch. 23.1 "Control Codes"): U+0000–U+001F and
// U+007F–U+009F. Tab, line feed and carriage return are kept for multi-line notes.
const REFUSED = [
  ...Array.from({ length: 0x20 }, (_, i) => i).filter((c) => ![0x09, 0x0a, 0x0d].includes(c)),
  ...Array.from({ length: 0x21 }, (_, i) => 0x7f + i),
];

describe('control characters', () => {
  it('refuses every Cc character but tab, line feed and carriage return (62 of 65)', () => {
    expect(REFUSED).toHaveLength(62);
    for (const code of REFUSED)
      expect([code, isFreeOfControlCharacters(`a${String.fromCharCode(code)}b`)]).toEqual([code, false]);
    for (const kept of ['\t', '\n', '\r', ' ', 'é', '—', '\u00a0', '🏃'])
      expect(isFreeOfControlCharacters(`a${kept}b`)).toBe(true);
  });

  it('names each field holding one, at any depth, keys included; passwords are left alone', () => {
    expect(
      controlCharacterIssues({
        name: 'ok',
        note: 'x\u0000',
        parts: [{ notes: 'fine' }, { notes: '\u001b[31m' }],
        password: 'any\u0007thing',
        ['bad\u0000key']: 1,
      }),
    ).toEqual([
      { field: 'note', message: CONTROL_CHARACTER_MESSAGE },
      { field: 'parts.1.notes', message: CONTROL_CHARACTER_MESSAGE },
      { field: 'bad?key', message: CONTROL_CHARACTER_MESSAGE },
    ]);
    expect(controlCharacterIssues({ text: 'Line one\r\nline\ttwo' })).toEqual([]);
    expect(controlCharacterIssues(null)).toEqual([]);
  });
});
