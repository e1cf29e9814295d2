import type { ExpandedPart } from './types.ts';

/**
 * True for a recovery jog that closes the last round of a repeat with a rep in it: shorthand writes
 * recoveries between reps ("6 x 800 m w/ 400 m jog"), so this one exists only in the unrolled list.
 * A recovery after the last rep is written as its own part after the repeat.
 */
export function isClosingRecovery(parts: readonly ExpandedPart[], i: number): boolean {
  const part = parts[i]!;
  if (part.kind !== 'recovery jog' || !part.repeat || part.repeat.round !== part.repeat.rounds || part.repeat.step === 0)
    return false;
  const next = parts[i + 1];
  return !next || next.item_index !== part.item_index;
}
