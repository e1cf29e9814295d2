import { bottleDrinkAmounts, type Amounts, type BottleSummary, type FuelItemFacts } from './schedule.ts';

/** What was actually taken during a run, and how it compares with the fuel plan hour by hour. */

/** One recorded intake with what it carried (a snapshot: later edits of the item do not rewrite history). */
export interface TakenEntry extends Amounts {
  kind: 'item' | 'water' | 'drink';
  item_id: string | null;
  /** The plan's bottle a drink came from (drink entries only). */
  bottle?: string;
  name: string;
  servings: number | null;
  /** Seconds from the start; null when the runner did not say. */
  time_s: number | null;
}

export type TakenEntryInput =
  | { kind: 'item'; item_id: string; servings: number; time_s: number | null }
  | { kind: 'water'; fluid_ml: number; time_s: number | null }
  | { kind: 'drink'; bottle: string; fluid_ml: number; time_s: number | null };

/** A bottle of the run's fuel plan, as its schedule summarises it. */
export type PlannedBottle = Pick<
  BottleSummary,
  'id' | 'volume_ml' | 'carbohydrate_pct' | 'sodium_mg_per_l' | 'caffeine_mg_per_l'
>;

/** Why an entry cannot be resolved: its index, the field to blame and a sentence for the runner. */
export interface TakenEntryProblem {
  ok: false;
  index: number;
  field: 'item_id' | 'bottle' | 'fluid_ml';
  message: string;
}

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/**
 * Resolves entries against the runner's fuel items and the bottles of the run's fuel plan: an item entry carries the
 * item's amounts × servings, water only its millilitres, and a drink its millilitres with the bottle's carbohydrate,
 * sodium and caffeine in proportion (the plan's own bottle-drink computation). Returns the first entry that names an
 * unknown item or bottle, or drinks more than the bottle holds, as a problem.
 */
export function resolveTakenEntries(
  entries: readonly TakenEntryInput[],
  items: readonly FuelItemFacts[],
  bottles: readonly PlannedBottle[] = [],
): { ok: true; entries: TakenEntry[] } | TakenEntryProblem {
  const byId = new Map(items.map((i) => [i.id, i]));
  const bottleById = new Map(bottles.map((b) => [b.id, b]));
  const out: TakenEntry[] = [];
  for (const [index, e] of entries.entries()) {
    if (e.kind === 'drink') {
      const bottle = bottleById.get(e.bottle);
      if (!bottle)
        return { ok: false, index, field: 'bottle', message: "There is no bottle with this name in the run's fuel plan." };
      if (e.fluid_ml > bottle.volume_ml)
        return { ok: false, index, field: 'fluid_ml', message: 'A drink cannot be more than the bottle holds.' };
      const a = bottleDrinkAmounts(bottle, e.fluid_ml);
      out.push({
        kind: 'drink',
        item_id: null,
        bottle: bottle.id,
        name: `bottle ${bottle.id}`,
        servings: null,
        time_s: e.time_s,
        carbohydrate_g: round3(a.carbohydrate_g),
        fluid_ml: round3(a.fluid_ml),
        sodium_mg: round3(a.sodium_mg),
        caffeine_mg: round3(a.caffeine_mg),
      });
      continue;
    }
    if (e.kind === 'water') {
      out.push({
        kind: 'water',
        item_id: null,
        name: 'water',
        servings: null,
        time_s: e.time_s,
        carbohydrate_g: 0,
        fluid_ml: e.fluid_ml,
        sodium_mg: 0,
        caffeine_mg: 0,
      });
      continue;
    }
    const item = byId.get(e.item_id);
    if (!item)
      return {
        ok: false,
        index,
        field: 'item_id',
        message: 'This item is no longer among your fuel items: remove the entry, or add the item again.',
      };
    out.push({
      kind: 'item',
      item_id: item.id,
      name: item.name,
      servings: e.servings,
      time_s: e.time_s,
      carbohydrate_g: item.carbohydrate_g * e.servings,
      fluid_ml: item.fluid_ml * e.servings,
      sodium_mg: item.sodium_mg * e.servings,
      caffeine_mg: item.caffeine_mg * e.servings,
    });
  }
  return { ok: true, entries: out };
}

export interface PlannedVsTakenHour {
  hour: number;
  from_s: number;
  to_s: number;
  planned: Amounts;
  taken: Amounts;
}

export interface PlannedVsTaken {
  hours: PlannedVsTakenHour[];
  /** Entries taken without a time. */
  untimed: Amounts;
  totals: { planned: Amounts; taken: Amounts };
}

function zero(): Amounts {
  return { carbohydrate_g: 0, fluid_ml: 0, sodium_mg: 0, caffeine_mg: 0 };
}

function add(into: Amounts, a: Amounts): void {
  into.carbohydrate_g = Math.round((into.carbohydrate_g + a.carbohydrate_g) * 1000) / 1000;
  into.fluid_ml = Math.round((into.fluid_ml + a.fluid_ml) * 1000) / 1000;
  into.sodium_mg = Math.round((into.sodium_mg + a.sodium_mg) * 1000) / 1000;
  into.caffeine_mg = Math.round((into.caffeine_mg + a.caffeine_mg) * 1000) / 1000;
}

/**
 * Planned and taken amounts per clock hour from the start (hour 1 = [0, 1 h)). The hours run to the later of the
 * planned duration, the run's elapsed time and the last timed entry. Untimed entries are counted apart.
 */
export function comparePlannedWithTaken(
  planned: ReadonlyArray<Amounts & { time_s: number }>,
  taken: ReadonlyArray<Amounts & { time_s: number | null }>,
  durationS: number,
): PlannedVsTaken {
  const last = Math.max(durationS, ...planned.map((p) => p.time_s), ...taken.map((t) => t.time_s ?? 0));
  const count = Math.max(1, Math.ceil(last / 3600 - 1e-9));
  const hours: PlannedVsTakenHour[] = Array.from({ length: count }, (_, h) => ({
    hour: h + 1,
    from_s: h * 3600,
    to_s: Math.min((h + 1) * 3600, last),
    planned: zero(),
    taken: zero(),
  }));
  const bucket = (t: number) => hours[Math.min(count - 1, Math.floor(t / 3600))]!;
  const totals = { planned: zero(), taken: zero() };
  const untimed = zero();
  for (const p of planned) {
    add(bucket(p.time_s).planned, p);
    add(totals.planned, p);
  }
  for (const t of taken) {
    add(t.time_s === null ? untimed : bucket(t.time_s).taken, t);
    add(totals.taken, t);
  }
  return { hours, untimed, totals };
}
