import { isClosingRecovery } from '../plans/closing-recovery.ts';
import { expandParts, resolveTargets } from '../plans/expand.ts';
import type { ExpandedPart, PlanItem, RacePaces } from '../plans/types.ts';
import { METRES_PER_KM, METRES_PER_MILE } from '../units.ts';
import { mlToUsFlOz, type FuelTarget, type FuelTargets } from './targets.ts';

/**
 * The fuel schedule: where (mile and km) and when (clock) each planned intake falls on a run of known distance and
 * pace, what it carries (carbohydrate, fluid, sodium, caffeine), and the totals of each clock hour against the
 * targets. Field names are snake_case because these objects travel as JSON unchanged.
 */

/** A bad input the caller can fix; `field` is the dotted input path when one field is to blame. */
export class FuelPlanError extends Error {
  constructor(
    message: string,
    readonly field: string | null = null,
  ) {
    super(message);
    this.name = 'FuelPlanError';
  }
}

/** Guard rails shared with the API schemas. */
export const FUEL_LIMITS = {
  maxRules: 30,
  maxPointsPerRule: 100,
  maxBottles: 6,
  maxBottleContents: 6,
  /** Scheduled intakes after the rules are applied: "500 gels" is refused. */
  maxScheduledIntakes: 200,
  maxServings: 10,
  minEveryS: 60,
  minEveryDistance: 0.1,
} as const;

// ─── Course: distance against time ─────────────────────────────────────────────────────────

export type PaceFrom = 'target' | 'race pace' | 'easy pace' | 'even';

/** A stretch run at one pace. */
export interface CourseSegment {
  /** The plan part's kind, or `race` for a goal race. */
  kind: string;
  distance_m: number;
  duration_s: number;
  pace_s_per_km: number;
  pace_from: PaceFrom;
}

/** The expected run: total distance and time and the stretches between. */
export interface Course {
  distance_m: number;
  duration_s: number;
  segments: CourseSegment[];
}

function course(segments: CourseSegment[]): Course {
  return {
    distance_m: segments.reduce((s, x) => s + x.distance_m, 0),
    duration_s: segments.reduce((s, x) => s + x.duration_s, 0),
    segments,
  };
}

/** A race at even pace: `distanceM` metres in `timeS` seconds (a goal race's goal time). */
export function courseFromRace(distanceM: number, timeS: number): Course {
  if (!(Number.isFinite(distanceM) && distanceM > 0))
    throw new FuelPlanError('The race distance must be more than 0.', 'distance_m');
  if (!(Number.isFinite(timeS) && timeS > 0)) throw new FuelPlanError('The goal time must be more than 0.', 'goal_time_s');
  return course([
    { kind: 'race', distance_m: distanceM, duration_s: timeS, pace_s_per_km: timeS / (distanceM / 1000), pace_from: 'even' },
  ]);
}

/**
 * The expected distance and time of a session plan from its expanded parts: a part with a pace target runs at the
 * middle of its range, a race-named pace at the runner's race pace (`racePaces`, seconds per km), and a part with an
 * effort or heart-rate target at `easyPaceSPerKm`. A distance part's time is distance × pace; a timed part's distance
 * is time ÷ pace. Throws `FuelPlanError` when a part needs the easy pace and none is given, or when a race pace is
 * missing (its sentence says what to set).
 */
export function expectedDurationFromPlan(parts: readonly ExpandedPart[], racePaces: RacePaces, easyPaceSPerKm?: number): Course {
  if (parts.length === 0) throw new FuelPlanError('The plan has no parts.');
  if (easyPaceSPerKm !== undefined && !(Number.isFinite(easyPaceSPerKm) && easyPaceSPerKm > 0))
    throw new FuelPlanError('An easy pace must be more than 0.', 'easy_pace_s_per_km');
  const segments = resolveTargets(parts, racePaces).map((part): CourseSegment => {
    let pace: number;
    let from: PaceFrom;
    const r = part.resolved;
    if (r.type === 'pace') {
      pace = (r.fast_s_per_km + r.slow_s_per_km) / 2;
      from = r.from === 'written' ? 'target' : 'race pace';
    } else if (r.type === 'unresolved') {
      throw new FuelPlanError(`Part ${part.index + 1} (${part.kind}): ${r.reason}`);
    } else {
      if (easyPaceSPerKm === undefined)
        throw new FuelPlanError(
          `Part ${part.index + 1} (${part.kind}) has no pace target: give your easy pace to time it.`,
          'easy_pace_s_per_km',
        );
      pace = easyPaceSPerKm;
      from = 'easy pace';
    }
    const a = part.amount;
    return a.type === 'distance'
      ? {
          kind: part.kind,
          distance_m: a.distance_m,
          duration_s: (a.distance_m / 1000) * pace,
          pace_s_per_km: pace,
          pace_from: from,
        }
      : {
          kind: part.kind,
          distance_m: (a.duration_s / pace) * 1000,
          duration_s: a.duration_s,
          pace_s_per_km: pace,
          pace_from: from,
        };
  });
  return course(segments);
}

/**
 * `expectedDurationFromPlan` for a plan's items (unrolls repeats first). A recovery after the last rep
 * is run only when written (`isClosingRecovery`, as the plan check and the weekly volume count it):
 * "6 x 3 min w/ 90 s jog" is six reps and five jogs.
 */
export function courseFromPlanItems(items: readonly PlanItem[], racePaces: RacePaces, easyPaceSPerKm?: number): Course {
  const parts = expandParts(items);
  return expectedDurationFromPlan(
    parts.filter((_, i) => !isClosingRecovery(parts, i)),
    racePaces,
    easyPaceSPerKm,
  );
}

/** The same course run in `durationS` instead: every stretch's time scaled by one factor (the runner's own estimate). */
export function scaleCourse(c: Course, durationS: number): Course {
  if (!(Number.isFinite(durationS) && durationS > 0))
    throw new FuelPlanError('The expected duration must be more than 0.', 'expected_duration_s');
  const k = durationS / c.duration_s;
  return course(c.segments.map((s) => ({ ...s, duration_s: s.duration_s * k, pace_s_per_km: s.pace_s_per_km * k })));
}

/** Seconds from the start when the course reaches `distanceM` (clamped to the course). */
export function timeAtDistance(c: Course, distanceM: number): number {
  let d = 0;
  let t = 0;
  for (const s of c.segments) {
    if (distanceM <= d + s.distance_m) return t + ((distanceM - d) / s.distance_m) * s.duration_s;
    d += s.distance_m;
    t += s.duration_s;
  }
  return c.duration_s;
}

/** Metres from the start covered after `timeS` seconds (clamped to the course). */
export function distanceAtTime(c: Course, timeS: number): number {
  let d = 0;
  let t = 0;
  for (const s of c.segments) {
    if (timeS <= t + s.duration_s) return d + ((timeS - t) / s.duration_s) * s.distance_m;
    d += s.distance_m;
    t += s.duration_s;
  }
  return c.distance_m;
}

// ─── Inputs ────────────────────────────────────────────────────────────────────────────────

/** What one serving of a fuel item carries. */
export interface FuelItemFacts {
  id: string;
  name: string;
  serving: string;
  carbohydrate_g: number;
  sodium_mg: number;
  caffeine_mg: number;
  fluid_ml: number;
}

export type DistanceUnitMiKm = 'mi' | 'km';

/** When an intake is taken. Distances are in `unit`; times in seconds from the start. */
export type IntakeWhen =
  /** Every `every` mi/km, first at `first` (default `every`), never at or after the finish. */
  | { type: 'every_distance'; every: number; unit: DistanceUnitMiKm; first?: number | undefined }
  /** Every `every_s` seconds, first at `first_s` (default `every_s`), never at or after the finish. */
  | { type: 'every_time'; every_s: number; first_s?: number | undefined }
  | { type: 'at_distances'; at: number[]; unit: DistanceUnitMiKm }
  | { type: 'at_times'; at_s: number[] };

/** A planned intake: `servings` of a fuel item, or `ml` from a bottle, at the points `when` gives. */
export interface IntakeRule {
  item_id?: string | undefined;
  servings?: number | undefined;
  bottle?: string | undefined;
  ml?: number | undefined;
  when: IntakeWhen;
}

/** A bottle of `volume_ml` with fuel items mixed in (none: water). Item fluid is ignored: the volume is the liquid. */
export interface Bottle {
  id: string;
  volume_ml: number;
  contents: Array<{ item_id: string; servings: number }>;
}

export interface ScheduleInput {
  course: Course;
  items: readonly FuelItemFacts[];
  bottles?: readonly Bottle[] | undefined;
  intakes: readonly IntakeRule[];
  targets: FuelTargets;
  /** Start time of day `HH:MM`, to print the time of day of each intake too. */
  start_clock?: string | null | undefined;
  body_mass_kg?: number | undefined;
}

// ─── Output ────────────────────────────────────────────────────────────────────────────────

export interface Amounts {
  carbohydrate_g: number;
  fluid_ml: number;
  sodium_mg: number;
  caffeine_mg: number;
}

export interface ScheduledIntake extends Amounts {
  rule_index: number;
  item_id: string | null;
  bottle: string | null;
  /** "energy gel ×1" or "bottle A, 150 ml". */
  label: string;
  servings: number | null;
  ml: number | null;
  distance_m: number;
  distance_mi: number;
  distance_km: number;
  /** Seconds from the start (to the millisecond). */
  time_s: number;
  /** `h:mm:ss` from the start. */
  clock: string;
  /** `HH:MM` when a start time was given. */
  time_of_day: string | null;
  /** A bottle is refilled (or swapped for a full one) before this drink. */
  refill: boolean;
}

export type TargetStatus = 'within' | 'under' | 'over';

/** The glyph beside a status word (never colour alone). */
export const STATUS_GLYPHS: Readonly<Record<TargetStatus, string>> = { within: '✓', under: '▽', over: '△' };

export interface HourTotals extends Amounts {
  /** 1-based clock hour from the start. */
  hour: number;
  from_s: number;
  to_s: number;
  /** Length of this hour in hours (the last one may be partial; its targets are prorated). */
  hours: number;
  targets: Record<keyof FuelTargets, { low: number; high: number | null }>;
  status: Record<keyof FuelTargets, TargetStatus>;
}

export interface BottleSummary {
  id: string;
  volume_ml: number;
  volume_fl_oz: number;
  contents: Array<{ item_id: string; name: string; servings: number }>;
  carbohydrate_g: number;
  sodium_mg: number;
  caffeine_mg: number;
  /** Grams per 100 ml (6 % = 60 g/L). */
  carbohydrate_pct: number;
  sodium_mg_per_l: number;
  caffeine_mg_per_l: number;
  /** Times it is refilled after the start. */
  refills: number;
}

export interface FuelSchedule {
  distance_m: number;
  duration_s: number;
  intakes: ScheduledIntake[];
  hours: HourTotals[];
  totals: Amounts & { caffeine_mg_per_kg: number | null };
  /** Targets × the expected duration. */
  target_totals: Record<keyof FuelTargets, { low: number; high: number | null }>;
  status: Record<keyof FuelTargets, TargetStatus>;
  bottles: BottleSummary[];
  warnings: string[];
}

// ─── Computation ───────────────────────────────────────────────────────────────────────────

const TARGET_KEYS = ['carbohydrate', 'fluid', 'sodium'] as const;
const AMOUNT_OF: Record<(typeof TARGET_KEYS)[number], keyof Amounts> = {
  carbohydrate: 'carbohydrate_g',
  fluid: 'fluid_ml',
  sodium: 'sodium_mg',
};

/** `h:mm:ss` of a number of seconds (rounded to the second). 2400 → "0:40:00". */
export function formatClock(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  return `${h}:${String(m).padStart(2, '0')}:${String(s % 60).padStart(2, '0')}`;
}

function timeOfDay(startClock: string, offsetS: number): string {
  const [h, m] = startClock.split(':').map(Number) as [number, number];
  const minutes = Math.round((h * 3600 + m * 60 + offsetS) / 60) % (24 * 60);
  return `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
}

/** Compares an amount with a target range; values are compared to 0.1 so arithmetic noise never flips a status. */
export function compareWithTarget(value: number, target: { low: number; high: number | null }): TargetStatus {
  const v = Math.round(value * 10) / 10;
  if (v < Math.round(target.low * 10) / 10) return 'under';
  if (target.high !== null && v > Math.round(target.high * 10) / 10) return 'over';
  return 'within';
}

function scaled(t: FuelTarget, hours: number): { low: number; high: number | null } {
  return { low: t.low * hours, high: t.high === null ? null : t.high * hours };
}

function ms(x: number): number {
  return Math.round(x * 1000) / 1000;
}

function metres(value: number, unit: DistanceUnitMiKm): number {
  return value * (unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM);
}

function assertPositive(value: number, message: string, field: string): void {
  if (!(Number.isFinite(value) && value > 0)) throw new FuelPlanError(message, field);
}

/** The points (seconds from the start) a rule gives on `c`; `dropped` counts those after the finish. */
function pointsOf(rule: IntakeRule, c: Course, field: string): { times: number[]; dropped: number } {
  const w = rule.when;
  const times: number[] = [];
  let dropped = 0;
  const tooMany = () => new FuelPlanError(`This rule gives more than ${FUEL_LIMITS.maxScheduledIntakes} intakes.`, field);
  switch (w.type) {
    case 'every_distance': {
      assertPositive(w.every, 'Give a distance between intakes.', `${field}.when.every`);
      if (w.every < FUEL_LIMITS.minEveryDistance)
        throw new FuelPlanError('Intakes are at least 0.1 apart.', `${field}.when.every`);
      const first = w.first ?? w.every;
      if (!(Number.isFinite(first) && first >= 0))
        throw new FuelPlanError('The first intake cannot be before the start.', `${field}.when.first`);
      for (let k = 0; ; k++) {
        const d = metres(first + k * w.every, w.unit);
        if (d >= c.distance_m - 1e-6) break;
        if (times.length >= FUEL_LIMITS.maxScheduledIntakes) throw tooMany();
        times.push(timeAtDistance(c, d));
      }
      break;
    }
    case 'every_time': {
      assertPositive(w.every_s, 'Give the time between intakes.', `${field}.when.every_s`);
      if (w.every_s < FUEL_LIMITS.minEveryS)
        throw new FuelPlanError('Intakes are at least a minute apart.', `${field}.when.every_s`);
      const first = w.first_s ?? w.every_s;
      if (!(Number.isFinite(first) && first >= 0))
        throw new FuelPlanError('The first intake cannot be before the start.', `${field}.when.first_s`);
      for (let k = 0; ; k++) {
        const t = first + k * w.every_s;
        if (t >= c.duration_s - 1e-6) break;
        if (times.length >= FUEL_LIMITS.maxScheduledIntakes) throw tooMany();
        times.push(t);
      }
      break;
    }
    case 'at_distances':
      for (const [i, at] of w.at.entries()) {
        if (!(Number.isFinite(at) && at >= 0)) throw new FuelPlanError('A distance cannot be negative.', `${field}.when.at.${i}`);
        const d = metres(at, w.unit);
        if (d > c.distance_m + 1e-6) dropped++;
        else times.push(timeAtDistance(c, d));
      }
      break;
    case 'at_times':
      for (const [i, at] of w.at_s.entries()) {
        if (!(Number.isFinite(at) && at >= 0)) throw new FuelPlanError('A time cannot be negative.', `${field}.when.at_s.${i}`);
        if (at > c.duration_s + 1e-6) dropped++;
        else times.push(at);
      }
      break;
  }
  return { times, dropped };
}

function emptyAmounts(): Amounts {
  return { carbohydrate_g: 0, fluid_ml: 0, sodium_mg: 0, caffeine_mg: 0 };
}

function addInto(total: Amounts, a: Amounts): void {
  total.carbohydrate_g += a.carbohydrate_g;
  total.fluid_ml += a.fluid_ml;
  total.sodium_mg += a.sodium_mg;
  total.caffeine_mg += a.caffeine_mg;
}

function round(a: Amounts, digits = 3): Amounts {
  const f = 10 ** digits;
  const r = (x: number) => Math.round(x * f) / f;
  return {
    carbohydrate_g: r(a.carbohydrate_g),
    fluid_ml: r(a.fluid_ml),
    sodium_mg: r(a.sodium_mg),
    caffeine_mg: r(a.caffeine_mg),
  };
}

/** One serving × n. */
function itemAmounts(item: FuelItemFacts, servings: number): Amounts {
  return {
    carbohydrate_g: item.carbohydrate_g * servings,
    fluid_ml: item.fluid_ml * servings,
    sodium_mg: item.sodium_mg * servings,
    caffeine_mg: item.caffeine_mg * servings,
  };
}

function summariseBottle(bottle: Bottle, items: ReadonlyMap<string, FuelItemFacts>, index: number): BottleSummary {
  const field = `bottles.${index}`;
  assertPositive(bottle.volume_ml, 'A bottle holds more than 0 ml.', `${field}.volume_ml`);
  const total = emptyAmounts();
  const contents = bottle.contents.map((c, i) => {
    const item = items.get(c.item_id);
    if (!item) throw new FuelPlanError('There is no fuel item with this id.', `${field}.contents.${i}.item_id`);
    assertPositive(c.servings, 'Servings must be more than 0.', `${field}.contents.${i}.servings`);
    addInto(total, itemAmounts(item, c.servings));
    return { item_id: item.id, name: item.name, servings: c.servings };
  });
  const litres = bottle.volume_ml / 1000;
  return {
    id: bottle.id,
    volume_ml: bottle.volume_ml,
    volume_fl_oz: mlToUsFlOz(bottle.volume_ml),
    contents,
    carbohydrate_g: total.carbohydrate_g,
    sodium_mg: total.sodium_mg,
    caffeine_mg: total.caffeine_mg,
    carbohydrate_pct: total.carbohydrate_g / litres / 10,
    sodium_mg_per_l: total.sodium_mg / litres,
    caffeine_mg_per_l: total.caffeine_mg / litres,
    refills: 0,
  };
}

/** The concentrations of a bottle that a drink from it carries (a `BottleSummary` has them). */
export type BottleMixFacts = Pick<BottleSummary, 'carbohydrate_pct' | 'sodium_mg_per_l' | 'caffeine_mg_per_l'>;

/**
 * What `ml` drunk from a bottle carries: the millilitres as fluid and the bottle's carbohydrate, sodium and caffeine
 * in proportion (half the bottle, half of each). Used for planned drinks and for drinks ticked off after the run.
 */
export function bottleDrinkAmounts(bottle: BottleMixFacts, ml: number): Amounts {
  const litres = ml / 1000;
  return {
    carbohydrate_g: bottle.carbohydrate_pct * 10 * litres,
    fluid_ml: ml,
    sodium_mg: bottle.sodium_mg_per_l * litres,
    caffeine_mg: bottle.caffeine_mg_per_l * litres,
  };
}

/**
 * Builds the schedule: every rule's points on the course (distance rules placed by the planned paces), each intake's
 * amounts, bottle refills (a drink that needs more than is left in its bottle starts a fresh one), and per clock
 * hour the totals against the targets (the last, partial hour's targets prorated). Intakes are ordered by time, then
 * by rule. Throws `FuelPlanError` for an unknown item or bottle, non-positive amounts, or more than
 * `FUEL_LIMITS.maxScheduledIntakes` intakes; points after the finish are left out with a warning.
 */
export function buildSchedule(input: ScheduleInput): FuelSchedule {
  const c = input.course;
  if (!(c.duration_s > 0 && c.distance_m > 0 && Number.isFinite(c.duration_s) && Number.isFinite(c.distance_m)))
    throw new FuelPlanError('The expected run needs a distance and a duration over 0.');
  if (input.intakes.length > FUEL_LIMITS.maxRules)
    throw new FuelPlanError(`At most ${FUEL_LIMITS.maxRules} intake rules.`, 'intakes');
  const items = new Map(input.items.map((i) => [i.id, i]));
  const bottleList = input.bottles ?? [];
  const bottles = new Map(bottleList.map((b, i) => [b.id, summariseBottle(b, items, i)]));
  if (bottles.size !== bottleList.length) throw new FuelPlanError('Give each bottle its own name.', 'bottles');

  const warnings: string[] = [];
  const raw: Array<Omit<ScheduledIntake, 'refill'>> = [];
  input.intakes.forEach((rule, ruleIndex) => {
    const field = `intakes.${ruleIndex}`;
    let amounts: Amounts;
    let label: string;
    if (rule.item_id !== undefined && rule.bottle === undefined) {
      const item = items.get(rule.item_id);
      if (!item) throw new FuelPlanError('There is no fuel item with this id.', `${field}.item_id`);
      const servings = rule.servings ?? 1;
      assertPositive(servings, 'Servings must be more than 0.', `${field}.servings`);
      amounts = itemAmounts(item, servings);
      label = `${item.name} ×${servings}`;
    } else if (rule.bottle !== undefined && rule.item_id === undefined) {
      const bottle = bottles.get(rule.bottle);
      if (!bottle) throw new FuelPlanError('There is no bottle with this name in the plan.', `${field}.bottle`);
      const ml = rule.ml ?? 0;
      assertPositive(ml, 'Give the millilitres of each drink.', `${field}.ml`);
      if (ml > bottle.volume_ml) throw new FuelPlanError('A drink cannot be more than the bottle holds.', `${field}.ml`);
      amounts = bottleDrinkAmounts(bottle, ml);
      label = `bottle ${bottle.id}, ${ml} ml`;
    } else {
      throw new FuelPlanError('Each intake is either a fuel item or a drink from a bottle.', field);
    }
    const { times, dropped } = pointsOf(rule, c, field);
    if (dropped > 0) warnings.push(`${dropped} of the points of intake ${ruleIndex + 1} fall after the finish and are left out.`);
    for (const t of times) {
      const time = ms(t);
      const d = distanceAtTime(c, time);
      raw.push({
        rule_index: ruleIndex,
        item_id: rule.bottle === undefined ? (rule.item_id ?? null) : null,
        bottle: rule.bottle ?? null,
        label,
        servings: rule.bottle === undefined ? (rule.servings ?? 1) : null,
        ml: rule.bottle === undefined ? null : (rule.ml ?? null),
        distance_m: ms(d),
        distance_mi: Math.round((d / METRES_PER_MILE) * 1e4) / 1e4,
        distance_km: Math.round((d / METRES_PER_KM) * 1e4) / 1e4,
        time_s: time,
        clock: formatClock(time),
        time_of_day: input.start_clock ? timeOfDay(input.start_clock, time) : null,
        ...round(amounts),
      });
      if (raw.length > FUEL_LIMITS.maxScheduledIntakes)
        throw new FuelPlanError(
          `The plan gives more than ${FUEL_LIMITS.maxScheduledIntakes} intakes; space them out.`,
          'intakes',
        );
    }
  });
  raw.sort((a, b) => a.time_s - b.time_s || a.rule_index - b.rule_index);

  const left = new Map([...bottles.values()].map((b) => [b.id, b.volume_ml]));
  const intakes: ScheduledIntake[] = raw.map((x) => {
    if (x.bottle === null) return { ...x, refill: false };
    const bottle = bottles.get(x.bottle)!;
    let remaining = left.get(x.bottle)!;
    let refill = false;
    if (x.ml! > remaining + 1e-9) {
      refill = true;
      bottle.refills++;
      remaining = bottle.volume_ml;
    }
    left.set(x.bottle, remaining - x.ml!);
    return { ...x, refill };
  });

  const hourCount = Math.max(1, Math.ceil(c.duration_s / 3600 - 1e-9));
  const hours: HourTotals[] = [];
  for (let h = 0; h < hourCount; h++) {
    const from = h * 3600;
    const to = Math.min((h + 1) * 3600, c.duration_s);
    const total = emptyAmounts();
    for (const x of intakes) {
      const bucket = Math.min(hourCount - 1, Math.floor(x.time_s / 3600));
      if (bucket === h) addInto(total, x);
    }
    const length = (to - from) / 3600;
    const targets = Object.fromEntries(TARGET_KEYS.map((k) => [k, scaled(input.targets[k], length)])) as HourTotals['targets'];
    const status = Object.fromEntries(
      TARGET_KEYS.map((k) => [k, compareWithTarget(total[AMOUNT_OF[k]], targets[k])]),
    ) as HourTotals['status'];
    hours.push({ hour: h + 1, from_s: ms(from), to_s: ms(to), hours: length, ...round(total), targets, status });
  }

  const totals = emptyAmounts();
  for (const x of intakes) addInto(totals, x);
  const durationH = c.duration_s / 3600;
  const targetTotals = Object.fromEntries(
    TARGET_KEYS.map((k) => [k, scaled(input.targets[k], durationH)]),
  ) as FuelSchedule['target_totals'];
  const mass = input.body_mass_kg;
  return {
    distance_m: c.distance_m,
    duration_s: c.duration_s,
    intakes,
    hours,
    totals: {
      ...round(totals),
      caffeine_mg_per_kg: mass && mass > 0 ? Math.round((totals.caffeine_mg / mass) * 100) / 100 : null,
    },
    target_totals: targetTotals,
    status: Object.fromEntries(
      TARGET_KEYS.map((k) => [k, compareWithTarget(totals[AMOUNT_OF[k]], targetTotals[k])]),
    ) as FuelSchedule['status'],
    bottles: [...bottles.values()],
    warnings,
  };
}
