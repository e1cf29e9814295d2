import { describe, expect, it } from 'vitest';
import { readXmlEvents, XmlReadError } from '../../../../server/features/runs/parse/xml-events.ts';

function eventsOf(xml: string): string[] {
  const events: string[] = [];
  readXmlEvents(xml, {
    open: (name, attrs) =>
      events.push(
        `<${name}${Object.entries(attrs)
          .map(([k, v]) => ` ${k}=${v}`)
          .join('')}>`,
      ),
    text: (value) => events.push(`"${value}"`),
    close: (name) => events.push(`</${name}>`),
  });
  return events;
}

function errorOf(xml: string): XmlReadError {
  try {
    eventsOf(xml);
  } catch (error) {
    if (error instanceof XmlReadError) return error;
    throw error;
  }
  throw new Error('expected an XmlReadError');
}

describe('readXmlEvents', () => {
  it('strips namespace prefixes from elements and attributes and drops namespace declarations', () => {
    expect(eventsOf('<a xmlns="urn:a" xmlns:x="urn:x" x:b="1" c="2"><x:d>7</x:d><e/></a>')).toEqual([
      '<a b=1 c=2>',
      '<d>',
      '"7"',
      '</d>',
      '<e>',
      '</e>',
      '</a>',
    ]);
  });

  it('joins CDATA with the text around it, drops comments and whitespace-only text', () => {
    expect(eventsOf('<a>\n  <b> 12<![CDATA[.5]]><!-- note -->0 </b>\n</a>')).toEqual(['<a>', '<b>', '"12.50"', '</b>', '</a>']);
  });

  it('decodes the five predefined entities (XML 1.0 §4.6) and nothing else', () => {
    expect(eventsOf('<a n="Reed &amp; Shore"><b>Reed &amp; Shore &lt;1&gt; &quot;&apos;</b></a>')).toEqual([
      '<a n=Reed & Shore>',
      '<b>',
      '"Reed & Shore <1> "\'"',
      '</b>',
      '</a>',
    ]);
  });

  it.each([
    ['an undefined entity', '<a><b>&secret;</b></a>', /undefined entity/],
    ['an entity declared in the DOCTYPE', '<!DOCTYPE a [<!ENTITY x "y">]><a>&x;</a>', /entity declarations/],
    ['an external DTD with an entity reference', '<!DOCTYPE a SYSTEM "http://lake.invalid/a.dtd"><a>&x;</a>', /undefined entity/],
    ['a mismatched close tag', '<a><b></c></a>', /close tag/],
    ['a truncated document', '<a><b>1</b>', /unclosed tag/],
    ['a second root', '<a/><b/>', /one root/],
    ['an empty document', '', /root element/],
    ['nesting deeper than 64 elements', `${'<x>'.repeat(65)}${'</x>'.repeat(65)}`, /nested too deeply/],
  ])('refuses %s with an XmlReadError', (_label, xml, message) => {
    expect(errorOf(xml).message).toMatch(message);
  });

  it('lets errors thrown by a handler pass through unchanged', () => {
    const failure = new RangeError('reader gave up');
    expect(() =>
      readXmlEvents('<a/>', {
        open: () => {
          throw failure;
        },
        text: () => undefined,
        close: () => undefined,
      }),
    ).toThrow(failure);
  });
});
