import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { damage, excerpt } from '../../../support/damaged-xml.ts';
import { decodeXml } from '../../../../server/features/runs/parse/detect.ts';
import { ElementScanner } from '../../../../server/features/runs/parse/element-scanner.ts';
import { readXmlEvents, XmlReadError } from '../../../../server/features/runs/parse/xml-events.ts';
import { createPrng, generateLakeRun } from '../../../../shared/tracks/synthetic.ts';
import { writeGpx, writeTcx } from '../../../../shared/tracks/write-track.ts';

const SAMPLE_DIR = join(import.meta.dirname, '..', '..', '..', '..', 'fixtures', 'gps-samples');
/** A generated run as our own writers produce it (fixtures/generated is not in git, so made here). */
const LAKE_RUN = generateLakeRun({
  start_t: Date.UTC(2024, 8, 14, 6, 30),
  phases: [{ kind: 'run', duration_s: 1200, speed_mps: 3 }],
  seed: 7,
  gps_sigma_m: 1,
  device_distance: true,
  sample_s: 2,
});
/** Every real device sample, plus the generated run as GPX and TCX. */
const SAMPLES = [
  ...readdirSync(SAMPLE_DIR)
    .filter((file) => /\.(gpx|tcx)$/.test(file))
    .map((file) => ({ file, text: decodeXml(readFileSync(join(SAMPLE_DIR, file))) })),
  { file: 'generated-lake.gpx', text: writeGpx('Generated lake run', [LAKE_RUN.points]) },
  { file: 'generated-lake.tcx', text: writeTcx(LAKE_RUN.points, []) },
];

const pointElement = (file: string): string => (file.endsWith('.tcx') ? 'Trackpoint' : 'trkpt');

type Outcome = { events: string[]; scanned: number } | { error: string };

/** Every event as text, or the XmlReadError: what a reader can observe. */
function outcomeOf(xml: string, repeatedElement?: string): Outcome {
  const events: string[] = [];
  try {
    const scanned = readXmlEvents(
      xml,
      {
        open: (name, attrs) => events.push(`<${name} ${JSON.stringify(Object.entries(attrs))}>`),
        text: (value) => events.push(JSON.stringify(value)),
        close: (name) => events.push(`</${name}>`),
      },
      repeatedElement === undefined ? {} : { repeatedElement },
    );
    return { events, scanned };
  } catch (error) {
    if (error instanceof XmlReadError) return { error: 'XmlReadError' };
    throw error;
  }
}

/** The scanner changes nothing a reader sees: same events, or the same refusal. */
function expectSameAsSaxes(xml: string, repeatedElement: string): Outcome {
  const fast = outcomeOf(xml, repeatedElement);
  const plain = outcomeOf(xml);
  if ('error' in plain) expect(fast).toEqual(plain);
  // One string per document: comparing thousands of events one by one is slow to report.
  else expect('events' in fast ? fast.events.join('\n') : fast).toBe(plain.events.join('\n'));
  return fast;
}

describe('the track point scanner gives the events saxes gives', () => {
  it.each(SAMPLES.map((s) => [s.file, s.text] as const))('%s', (file, text) => {
    const outcome = expectSameAsSaxes(text, pointElement(file));
    // And it does the work: every point of a readable sample goes through the scanner.
    const markers = text.split(`<${pointElement(file)}`).length - 1;
    if ('scanned' in outcome) expect(outcome.scanned).toBe(markers);
  });

  const gpx = (points: string): string =>
    `<?xml version="1.0"?>\n<gpx version="1.1" xmlns:x="urn:x"><trk><trkseg>\n${points}\n</trkseg></trk></gpx>`;
  const pt = (inner = '<ele>12.5</ele><time>2024-09-14T06:30:00Z</time>', attrs = 'lat="46.2" lon="-31.4"'): string =>
    `<trkpt ${attrs}>${inner}</trkpt>`;

  it.each<[string, string, 'read' | 'refused', number]>([
    // label, document, what saxes does with it, how many points the scanner reads
    ['plain points', gpx(pt() + '\n' + pt()), 'read', 2],
    ['self-closing points and children', gpx(`<trkpt lat="1" lon="2"/>\n${pt('<ele/><x:hr >150</x:hr >')}`), 'read', 2],
    ['single quotes, spaces around =, > in a value', gpx(pt(undefined, `lat = '46.2' lon="a>b"`)), 'read', 1],
    ['namespace declarations and prefixed attributes', gpx(pt('<x:e xmlns:x="urn:x" x:a="1" a="2"/>')), 'read', 1],
    ['mixed text and children', gpx(pt('<ele>1<b/>2</ele>')), 'read', 1],
    ['carriage returns around text', gpx(pt('<ele>\r\n 12 \r\n</ele>')), 'read', 1],
    ['a carriage return inside text (saxes makes it a line feed)', gpx(pt('<desc>a\r\nb</desc>')), 'read', 0],
    ['a comment inside a point', gpx(pt('<!-- x --><ele>1</ele>')), 'read', 0],
    ['CDATA inside a point', gpx(pt('<ele><![CDATA[12]]></ele>')), 'read', 0],
    ['an entity in text', gpx(pt('<name>a &amp; b</name>')), 'read', 0],
    ['an entity in an attribute', gpx(pt('', 'lat="&#52;6" lon="1"')), 'read', 0],
    ['non-ASCII text', gpx(pt('<name>Løype</name>')), 'read', 0],
    ['a tab in an attribute (saxes makes it a space)', gpx(pt('', 'lat="4\t6" lon="1"')), 'read', 0],
    ['a processing instruction inside a point', gpx(pt('<?note x?>')), 'read', 0],
    ['a __proto__ attribute', gpx(pt('<x __proto__="1"/>')), 'read', 0],
    ['the point after a comment', gpx(`<!-- a -->${pt()}\n${pt()}`), 'read', 1],
    ['a point inside a comment', gpx(`${pt()}<!-- ${pt()} -->`), 'read', 1],
    ['a point inside CDATA', gpx(`<desc><![CDATA[ ${pt()} ]]></desc>`), 'read', 0],
    ['a duplicate attribute', gpx(pt('', 'lat="1" lat="2"')), 'refused', 0],
    ['attributes without whitespace between them', gpx(pt('', 'lat="1"lon="2"')), 'refused', 0],
    ['an attribute without a value', gpx(pt('', 'lat lon="2"')), 'refused', 0],
    ['a < in an attribute value', gpx(pt('', 'lat="<1" lon="2"')), 'refused', 0],
    ['a mismatched end tag', gpx(pt('<ele>1</elevation>')), 'refused', 0],
    ['an end tag with a longer name', gpx(pt('<ele>1</elex>')), 'refused', 0],
    [']]> in text', gpx(pt('<ele>1]]>2</ele>')), 'refused', 0],
    ['an undefined entity', gpx(pt('<ele>&bomb;</ele>')), 'refused', 0],
    ['a control character', gpx(pt('<ele>1\u0001</ele>')), 'refused', 0],
    ['a point cut off at the end', `<gpx><trk><trkseg>\n${pt()}\n<trkpt lat="1" lon="2"><ele>1</e`, 'refused', 1],
    ['a second root that is a point', `<gpx/>\n${pt()}`, 'refused', 0],
    ['a point before the root', `${pt()}\n<gpx/>`, 'refused', 0],
    ['a point nested too deeply', gpx(pt(`${'<x>'.repeat(61)}${'</x>'.repeat(61)}`)), 'refused', 0],
    ['a point exactly at the depth limit', gpx(pt(`${'<x>'.repeat(60)}${'</x>'.repeat(60)}`)), 'read', 1],
  ])('%s', (_label, xml, saxes, scanned) => {
    expect('error' in outcomeOf(xml) ? 'refused' : 'read').toBe(saxes);
    const outcome = expectSameAsSaxes(xml, 'trkpt');
    if ('scanned' in outcome) expect(outcome.scanned).toBe(scanned);
  });

  // Seeded, so a failure repeats (tests/support/damaged-xml.ts: damage aimed at track points).

  it('1 000 damaged samples: the same events or the same refusal, with and without the scanner', () => {
    const random = createPrng(8);
    const small = SAMPLES.map((s) => ({ file: s.file, text: excerpt(s.file, s.text) }));
    for (const sample of small) expect('events' in outcomeOf(sample.text) || sample.file.startsWith('truncated')).toBe(true);
    const outcomes = { read: 0, refused: 0, scanned: 0 };
    for (let i = 0; i < 1000; i++) {
      const sample = small[i % small.length]!;
      const damaged = random() < 0.3 ? damage(damage(sample.text, random), random) : damage(sample.text, random);
      const outcome = expectSameAsSaxes(damaged, pointElement(sample.file));
      if ('error' in outcome) outcomes.refused++;
      else {
        outcomes.read++;
        outcomes.scanned += outcome.scanned;
      }
    }
    // Both kinds happen, and the scanner did read points of damaged files.
    expect(outcomes.read).toBeGreaterThan(100);
    expect(outcomes.refused).toBeGreaterThan(100);
    expect(outcomes.scanned).toBeGreaterThan(1000);
  }, 30_000);
});

describe('ElementScanner', () => {
  it('reads one plain element and stops right after it', () => {
    const xml = '<p a="1"><q>2</q></p> rest';
    const scanner = new ElementScanner();
    expect(scanner.scan(xml, 0, 64)).toBe(xml.indexOf(' rest'));
    const events: string[] = [];
    scanner.replay(xml, {
      open: (name, attrs) => events.push(`<${name}${Object.entries(attrs).join(';')}>`),
      text: (value) => events.push(value),
      close: (name) => events.push(`</${name}>`),
    });
    expect(events).toEqual(['<pa,1>', '<q>', '2', '</q>', '</p>']);
  });

  it.each([
    ['a comment', '<p><!--x--></p>'],
    ['an unfinished element', '<p><q>1</q>'],
    ['an element deeper than allowed', '<p><q><r/></q></p>'],
    ['an end tag first', '</p>'],
  ])('gives up on %s', (_label, xml) => {
    expect(new ElementScanner().scan(xml, 0, 2)).toBe(-1);
  });
});
