import { useEffect, useRef } from 'react';
import { useMarkNotesRead } from '../api/unread.ts';

/** Marks the given unread notes opened once, when the page showing them is opened. */
export function useMarkReadOnOpen(unreadIds: readonly string[]) {
  const { mutate } = useMarkNotesRead();
  const sent = useRef(new Set<string>());
  const key = unreadIds.join(',');
  useEffect(() => {
    const fresh = key ? key.split(',').filter((id) => !sent.current.has(id)) : [];
    if (fresh.length === 0) return;
    for (const id of fresh) sent.current.add(id);
    mutate(fresh);
  }, [key, mutate]);
}
