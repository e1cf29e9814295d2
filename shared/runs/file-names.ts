/** Longest slug kept in a file name (characters); long run names are cut at a word boundary. */
export const MAX_SLUG_LENGTH = 60;

/**
 * A run name as a file-name part: lower case ASCII letters and digits joined by single hyphens, accents
 * dropped ("Tomás's Lake Loop!" → "tomass-lake-loop"); "run" when nothing is left.
 */
export function slugify(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/['’]/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  if (slug.length <= MAX_SLUG_LENGTH) return slug || 'run';
  const cut = slug.slice(0, MAX_SLUG_LENGTH);
  return cut.slice(0, cut.lastIndexOf('-') > 0 ? cut.lastIndexOf('-') : MAX_SLUG_LENGTH);
}

/** `2026-12-04-lake-tamsel-long-run-splits-mi.csv`: the run's local date and name, then what the file holds. */
export function runFileName(localDate: string, runName: string, what: string, extension: string): string {
  return `${localDate}-${slugify(runName)}-${what}.${extension}`;
}
