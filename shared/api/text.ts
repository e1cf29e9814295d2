import type { FieldIssue } from './errors.ts';

/**
 * Control characters no text field accepts (issue 13 #13): C0 controls other than tab, line feed and carriage
 * return (so notes keep their lines), DEL, and the C1 controls U+0080–U+009F. NUL in particular cannot be stored in
 * a PostgreSQL text column at all, which used to end in a 500.
 */
// eslint-disable-next-line no-control-regex
export const CONTROL_CHARACTER = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const CONTROL_CHARACTER_MESSAGE =
  'This text holds an invisible control character (such as NUL) that cannot be saved. Remove it, or type the text again.';

/** Fields never stored as text (only their hash is), so any character the person chose may stay. */
const EXEMPT_FIELD = /password/i;

/** Limits the walk: deeper than any body or query the API accepts (the JSON body itself is at most 1 MB). */
const MAX_DEPTH = 32;

/**
 * Every string in `value` (any depth, object keys included) holding a control character, as field issues with the
 * dotted path. Pure; `value` is a parsed JSON body, query or route parameters.
 */
export function controlCharacterIssues(value: unknown, path: readonly string[] = []): FieldIssue[] {
  const issues: FieldIssue[] = [];
  const visit = (v: unknown, at: readonly string[]): void => {
    if (typeof v === 'string') {
      if (CONTROL_CHARACTER.test(v)) issues.push({ field: at.join('.'), message: CONTROL_CHARACTER_MESSAGE });
      return;
    }
    if (v === null || typeof v !== 'object' || at.length > MAX_DEPTH) return;
    const entries = Array.isArray(v) ? v.map((item, i) => [String(i), item] as const) : Object.entries(v);
    for (const [key, item] of entries) {
      if (CONTROL_CHARACTER.test(key)) {
        issues.push({
          field: [...at, key.replace(new RegExp(CONTROL_CHARACTER, 'g'), '?')].join('.'),
          message: CONTROL_CHARACTER_MESSAGE,
        });
        continue;
      }
      if (EXEMPT_FIELD.test(key)) continue;
      visit(item, [...at, key]);
    }
  };
  visit(value, path);
  return issues;
}
