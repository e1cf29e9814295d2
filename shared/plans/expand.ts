import { raceNamedPaceLabel } from '../race/training-ranges.ts';
import { PLAN_LIMITS, RELATIVE_PACE_REFS } from './types.ts';
import type { ExpandedPart, Part, PlanItem, RacePaces, RelativePaceRef, ResolvedTarget } from './types.ts';

/**
 * The flat, ordered list of parts the plan check walks: every repeat is unrolled round by round,
 * so `6 x 800 m w/ 400 m jog` gives twelve entries (rep, jog, rep, jog, …). A recovery after the
 * last rep stays in the list (`isClosingRecovery`): the plan check uses it for the alignment only,
 * and nothing counts it as planned. Inputs are not mutated.
 */
export function expandParts(items: readonly PlanItem[]): ExpandedPart[] {
  const out: ExpandedPart[] = [];
  items.forEach((item, itemIndex) => {
    if (item.type === 'part') {
      out.push({ ...copyPart(item), index: out.length, item_index: itemIndex, repeat: null });
      return;
    }
    for (let round = 1; round <= item.count; round++) {
      item.parts.forEach((part, step) => {
        out.push({ ...copyPart(part), index: out.length, item_index: itemIndex, repeat: { round, rounds: item.count, step } });
      });
    }
  });
  return out;
}

/** How many parts `items` expands to, without building the list. */
export function countExpandedParts(items: readonly PlanItem[]): number {
  return items.reduce((n, item) => n + (item.type === 'part' ? 1 : item.count * item.parts.length), 0);
}

function copyPart(part: Part): Part {
  const t = part.target;
  const target = t.type === 'relative' && t.offset ? { ...t, offset: { ...t.offset } } : { ...t };
  return { type: 'part', kind: part.kind, amount: { ...part.amount }, target };
}

/** The words the Tools page and the plan editor use (`raceNamedPaceLabel`), in a sentence. */
const REF_NAMES: Record<RelativePaceRef, string> = Object.fromEntries(
  RELATIVE_PACE_REFS.map((ref) => {
    const label = raceNamedPaceLabel(ref);
    return [ref, label.charAt(0).toLowerCase() + label.slice(1)];
  }),
) as Record<RelativePaceRef, string>;

const REF_HELP: Record<RelativePaceRef, string> = {
  goal: 'set a goal race on your profile',
  MP: 'set a goal race or add a race result',
  HMP: 'set a goal race or add a race result',
  '10K': 'set a goal race or add a race result',
  '5K': 'set a goal race or add a race result',
};

/**
 * Makes each part's target concrete. Written paces, heart rates and effort pass through;
 * a race-named pace (`@ MP`, `@ 10K+5s/km`) takes its seconds per km from `paces` (the server
 * derives them from the runner's goal race and recent results), plus the offset, as a single pace
 * (fast = slow; the plan check applies its tolerance). A missing, non-positive or non-finite
 * entry, or one the offset pushes outside 1:30–20:00 per km, leaves the target `unresolved`
 * with a sentence saying why. Inputs are not mutated.
 */
export function resolveTargets<T extends Part>(parts: readonly T[], paces: RacePaces): Array<T & { resolved: ResolvedTarget }> {
  return parts.map((part) => ({ ...part, resolved: resolveTarget(part, paces) }));
}

function resolveTarget(part: Part, paces: RacePaces): ResolvedTarget {
  const t = part.target;
  switch (t.type) {
    case 'pace':
      return { type: 'pace', fast_s_per_km: t.fast_s_per_km, slow_s_per_km: t.slow_s_per_km, from: 'written' };
    case 'heart_rate':
      return { type: 'heart_rate', low_bpm: t.low_bpm, high_bpm: t.high_bpm };
    case 'effort':
      return { type: 'effort' };
    case 'relative': {
      const base = paces[t.ref];
      if (base === undefined || !Number.isFinite(base) || base <= 0) {
        return { type: 'unresolved', ref: t.ref, reason: `No ${REF_NAMES[t.ref]} yet: ${REF_HELP[t.ref]}.` };
      }
      const pace = base + (t.offset?.s_per_km ?? 0);
      if (pace < PLAN_LIMITS.fastestPaceSPerKm || pace > PLAN_LIMITS.slowestPaceSPerKm) {
        return {
          type: 'unresolved',
          ref: t.ref,
          reason: `With its offset, ${REF_NAMES[t.ref]} gives a pace outside 1:30–20:00 per km.`,
        };
      }
      return { type: 'pace', fast_s_per_km: pace, slow_s_per_km: pace, from: t.ref };
    }
  }
}
