import { useCallback, useEffect, useRef, useState } from 'react';

/** Drafts older than this are dropped on load (common practice: a week covers "I'll finish it tonight"). */
const MAX_AGE_MS = 7 * 24 * 3600 * 1000;
const PREFIX = 'pacewright:draft:';

type Stored<T> = { saved_at: number; value: T };

function read<T>(key: string): T | null {
  try {
    const raw = window.localStorage.getItem(PREFIX + key);
    if (!raw) return null;
    const stored = JSON.parse(raw) as Stored<T>;
    if (typeof stored?.saved_at !== 'number' || Date.now() - stored.saved_at > MAX_AGE_MS) return null;
    return stored.value;
  } catch {
    return null; // storage off (private mode) or a draft from an older shape: start from the server's copy
  }
}

/**
 * Form state that survives a reload: kept in localStorage under a key naming the user and the object
 * (e.g. `fuel-taken:<user>:<run>`), restored on the next visit until `clear()` after a successful save.
 * Never holds a password. `restored` says the form opened from a draft, so the page can say so.
 */
export function useDraft<T>(key: string, initial: () => T) {
  const [restored, setRestored] = useState(() => read<T>(key) !== null);
  const [value, setValue] = useState<T>(() => read<T>(key) ?? initial());
  const dirty = useRef(false);

  useEffect(() => {
    if (!dirty.current) return;
    try {
      window.localStorage.setItem(PREFIX + key, JSON.stringify({ saved_at: Date.now(), value } satisfies Stored<T>));
    } catch {
      // A full or disabled storage only loses the reload safety net, never the form itself.
    }
  }, [key, value]);

  const update = useCallback((next: T | ((current: T) => T)) => {
    dirty.current = true;
    setValue(next);
  }, []);

  const clear = useCallback(() => {
    dirty.current = false;
    try {
      window.localStorage.removeItem(PREFIX + key);
    } catch {
      // nothing stored
    }
  }, [key]);

  /** Drops the draft and puts the form back to `fresh` (e.g. the saved copy), without storing it again. */
  const discard = useCallback(
    (fresh: T) => {
      clear();
      setRestored(false);
      setValue(fresh);
    },
    [clear],
  );

  return { value, update, clear, discard, restored };
}
