import { useState } from 'react';

/**
 * A switch that saves on change shows the new choice in the same render as the click. A mutation's own
 * pending state reaches React a tick later, and a controlled input that snaps back for that tick reads
 * as "nothing happened" (a browser test caught it: "clicking the checkbox did not change its state").
 * The choice is held with the saved value it was made against, so once the saved value changes — this
 * save landing, or another switch — the saved value shows again; `release` drops it when a save fails.
 */
export function useHeldChoice<T>(saved: T) {
  const [choice, setChoice] = useState<{ value: T; madeAgainst: T } | null>(null);
  const shown = choice && Object.is(choice.madeAgainst, saved) ? choice.value : saved;
  return {
    shown,
    hold: (value: T) => setChoice({ value, madeAgainst: saved }),
    release: () => setChoice(null),
  };
}
