/**
 * Seeded damage for track files, aimed at track points (where the scanner and the point templates
 * work): shared by the element-scanner and point-template tests so both meet the same damage.
 */

const SNIPPETS = [
  '<',
  '>',
  '&',
  '&amp;',
  ']]>',
  '<!--x-->',
  '<![CDATA[1]]>',
  '\r',
  '\u0000',
  'é',
  '"',
  "'",
  '=',
  '/',
  ' ',
  '</',
  '<a>',
];

/** One random cut, insertion, deletion or replaced byte, near a track point 80 % of the time. */
export function damage(text: string, random: () => number): string {
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)] as T;
  const marker = text.indexOf('<trkpt') >= 0 ? '<trkpt' : '<Trackpoint';
  const near = text.indexOf(marker, Math.floor(random() * text.length));
  const at = near >= 0 && random() < 0.8 ? near + Math.floor(random() * 300) : Math.floor(random() * text.length);
  const kind = random();
  if (kind < 0.1) return text.slice(0, at);
  if (kind < 0.5) return text.slice(0, at) + pick(SNIPPETS) + text.slice(at);
  if (kind < 0.7) return text.slice(0, at) + text.slice(at + 1 + Math.floor(random() * 8));
  return text.slice(0, at) + String.fromCharCode(Math.floor(random() * 256)) + text.slice(at + 1);
}

/** The file with only its first 20 points (still well-formed), so a thousand damaged files stay quick. */
export function excerpt(file: string, text: string): string {
  const element = file.endsWith('.tcx') ? 'Trackpoint' : 'trkpt';
  let cut = -1;
  for (let k = 0, at = text.indexOf(`<${element}`); k <= 20 && at !== -1; k++, at = text.indexOf(`<${element}`, at + 1)) {
    cut = at;
  }
  const lastEnd = text.lastIndexOf(`</${element}>`);
  if (cut === -1 || lastEnd < cut) return text;
  return text.slice(0, cut) + text.slice(lastEnd + element.length + 3);
}
