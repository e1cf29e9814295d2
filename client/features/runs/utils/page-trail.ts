/**
 * The way back through the runs list's keyset pages (server/features/runs/README.md, decision 46). The server
 * answers the cursor of the page after (`next_cursor`), never of the page before; so each page shown records
 * "the page after me starts at cursor B; I start at cursor A (or by number)". The "newer" link of the page at B
 * then goes to A. Kept in the tab's sessionStorage so a reload keeps it; a shared link opened elsewhere has no
 * trail and its "newer" link falls back to the page number (an offset read, still correct, just not keyset).
 */

const STORAGE_KEY = 'pacewright.runs-page-trail';
/** Pages remembered per tab (each cursor ≤ 300 characters: ≤ ~120 kB of sessionStorage); the oldest go first. */
export const PAGE_TRAIL_MAX = 200;

type Trail = Record<string, string | null>;

function read(storage: Storage | undefined): Trail {
  try {
    const parsed: unknown = JSON.parse(storage?.getItem(STORAGE_KEY) ?? '{}');
    return parsed && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Trail) : {};
  } catch {
    return {}; // a damaged entry only costs the keyset way back
  }
}

const sessionStore = (): Storage | undefined => (typeof sessionStorage === 'undefined' ? undefined : sessionStorage);

/** Records that the page starting at `after` (undefined: read by its number) is followed by `next`. */
export function rememberPage(next: string, after: string | undefined, storage = sessionStore()): void {
  const trail = read(storage);
  if (trail[next] === (after ?? null)) return;
  delete trail[next]; // re-inserted last, so it is the newest
  trail[next] = after ?? null;
  const keys = Object.keys(trail);
  for (const key of keys.slice(0, Math.max(0, keys.length - PAGE_TRAIL_MAX))) delete trail[key];
  try {
    storage?.setItem(STORAGE_KEY, JSON.stringify(trail));
  } catch {
    // storage full or off (private mode): the "newer" link falls back to the page number
  }
}

/**
 * Where the page before the one at `after` starts: its cursor, or undefined when it is read by its number (the
 * first page, a page reached by number, or a page this tab has not seen).
 */
export function cursorBefore(after: string | undefined, storage = sessionStore()): string | undefined {
  if (!after) return undefined;
  return read(storage)[after] ?? undefined;
}
