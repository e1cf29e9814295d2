import type { IntakeRule } from '../../../../shared/fuel/schedule.ts';
import { FuelPlanInputSchema, type FuelPlanInput } from '../../../../shared/fuel/schemas.ts';
import { formatPace, paceKmToMile, paceMileToKm } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { parsePace, parseRunTime, readNumber, splitList, toMl, type VolumeUnit } from './fuel-format.ts';

/**
 * The fuel plan form as typed (text, kept in a draft over reloads), how it reads into the API's input, and
 * every problem placed on the control it belongs to, worded after that control's label: "m:ss per mi" under a
 * field labelled so, never "seconds per km" or "body mass kg".
 */

export const TARGET_KEYS = ['carbohydrate', 'fluid', 'sodium'] as const;
export type TargetKey = (typeof TARGET_KEYS)[number];
export const TARGET_WORDS: Record<TargetKey, { name: string; unit: string; example: string }> = {
  carbohydrate: { name: 'Carbohydrate', unit: 'g/h', example: '60' },
  fluid: { name: 'Fluid', unit: 'ml/h', example: '500' },
  sodium: { name: 'Sodium', unit: 'mg/h', example: '400' },
};

export type WhenType = IntakeRule['when']['type'];

export type IntakeDraft = {
  key: number;
  /** `item:<id>` or `bottle:<name>`; empty until the user chooses. */
  what: string;
  servings: string;
  ml: string;
  when: WhenType;
  every: string;
  unit: Unit;
  first: string;
  at: string;
};
export type ContentDraft = { key: number; itemId: string; servings: string };
export type BottleDraft = { key: number; name: string; volume: string; volumeUnit: VolumeUnit; contents: ContentDraft[] };
export type TargetDraft = { own: boolean; low: string; high: string };
export type PlanDraft = {
  bodyMass: string;
  duration: string;
  easyPace: string;
  startClock: string;
  sweat: string;
  targets: Record<TargetKey, TargetDraft>;
  bottles: BottleDraft[];
  intakes: IntakeDraft[];
};

/** Reads the draft into the API's input; text that does not read as a number becomes NaN so the schema names it. */
export function toPlanInput(d: PlanDraft, unit: Unit): unknown {
  const num = (t: string) => readNumber(t);
  const time = (t: string) => (t.trim() === '' ? undefined : (parseRunTime(t) ?? Number.NaN));
  const pace = d.easyPace.trim() === '' ? undefined : (parsePace(d.easyPace) ?? Number.NaN);
  const targets: Record<string, { low: number | undefined; high: number | undefined }> = {};
  for (const k of TARGET_KEYS) {
    const t = d.targets[k];
    if (t.own) targets[k] = { low: num(t.low), high: num(t.high) };
  }
  return {
    body_mass_kg: num(d.bodyMass),
    expected_duration_s: time(d.duration),
    easy_pace_s_per_km: pace === undefined || Number.isNaN(pace) ? pace : unit === 'mi' ? paceMileToKm(pace) : pace,
    start_clock: d.startClock.trim() === '' ? null : d.startClock.trim(),
    sweat_l_per_h: num(d.sweat),
    targets: Object.keys(targets).length > 0 ? targets : undefined,
    bottles: d.bottles.map((b) => {
      const v = num(b.volume);
      return {
        id: b.name.trim(),
        volume_ml: v === undefined || Number.isNaN(v) ? v : Math.round(toMl(v, b.volumeUnit) * 10) / 10,
        contents: b.contents.map((c) => ({ item_id: c.itemId, servings: num(c.servings) })),
      };
    }),
    intakes: d.intakes.map((r) => {
      const isBottle = r.what.startsWith('bottle:');
      const what = isBottle
        ? { bottle: r.what.slice('bottle:'.length), ml: num(r.ml) }
        : { item_id: r.what.slice('item:'.length) || undefined, servings: num(r.servings) };
      const list = splitList(r.at);
      const when =
        r.when === 'every_distance'
          ? { type: r.when, every: num(r.every), unit: r.unit, first: num(r.first) }
          : r.when === 'every_time'
            ? { type: r.when, every_s: (num(r.every) ?? Number.NaN) * 60, first_s: time(r.first) }
            : r.when === 'at_distances'
              ? { type: r.when, unit: r.unit, at: list.map(Number) }
              : { type: r.when, at_s: list.map((t) => parseRunTime(t) ?? Number.NaN) };
      return { ...what, when };
    }),
  };
}

/** The name of each control of the form; a problem is shown beside the control of the same name. */
const CONTROLS = [
  /^body_mass_kg$/,
  /^expected_duration_s$/,
  /^easy_pace_s_per_km$/,
  /^start_clock$/,
  /^sweat_l_per_h$/,
  /^targets\.(carbohydrate|fluid|sodium)\.(low|high)$/,
  /^bottles\.\d+\.(id|volume_ml)$/,
  /^bottles\.\d+\.contents\.\d+\.(item_id|servings)$/,
  /^intakes\.\d+\.(what|servings|ml)$/,
  /^intakes\.\d+\.when\.(every|first|at)$/,
];

/** The control an API path belongs to (`intakes.2.when.at_s.1` → `intakes.2.when.at`), or null for the form as a whole. */
export function controlOf(path: string): string | null {
  const name = path
    .replace(/^intakes\.(\d+)(\.(item_id|bottle))?$/, 'intakes.$1.what')
    .replace(/^(intakes\.\d+\.when)\.every_s$/, '$1.every')
    .replace(/^(intakes\.\d+\.when)\.first_s$/, '$1.first')
    .replace(/^(intakes\.\d+\.when)\.(at_s|at)(\.\d+)?$/, '$1.at');
  return CONTROLS.some((re) => re.test(name)) ? name : null;
}

const SERVINGS_WORDS = 'Write the servings as a number, e.g. 1 or 0.5.';

/** What to write in a control, in the words of its label: the answer to a missing or unreadable value. */
export function askFor(control: string, draft: PlanDraft, unit: Unit): string {
  const intake = /^intakes\.(\d+)\./.exec(control);
  const r = intake ? draft.intakes[Number(intake[1])] : undefined;
  const target = /^targets\.(\w+)\.(low|high)$/.exec(control);
  if (target) {
    const w = TARGET_WORDS[target[1] as TargetKey];
    return `Write the ${w.name.toLowerCase()} ${target[2]} figure in ${w.unit}, e.g. ${w.example}.`;
  }
  if (control === 'body_mass_kg') return 'Write the body mass in kg, e.g. 62.';
  if (control === 'expected_duration_s') return 'Write the expected duration as h:mm:ss, e.g. 2:30:00, or leave it empty.';
  if (control === 'easy_pace_s_per_km')
    return `Write the easy pace as m:ss per ${unit}, e.g. ${unit === 'mi' ? '9:30' : '5:55'}.`;
  if (control === 'start_clock') return 'Write the start time like 07:30.';
  if (control === 'sweat_l_per_h') return 'Write the sweat rate in L/h, e.g. 0.8, or leave it empty.';
  if (/^bottles\.\d+\.id$/.test(control)) return 'Name the bottle, e.g. A.';
  const bottle = /^bottles\.(\d+)\.volume_ml$/.exec(control);
  if (bottle) {
    const b = draft.bottles[Number(bottle[1])];
    return b?.volumeUnit === 'fl oz' ? 'Write the volume in US fl oz, e.g. 17.' : 'Write the volume in ml, e.g. 500.';
  }
  if (/contents\.\d+\.item_id$/.test(control)) return 'Choose the item to mix in, or remove this line.';
  if (/\.servings$/.test(control)) return SERVINGS_WORDS;
  if (/\.what$/.test(control)) return 'Choose an item or a bottle for this intake.';
  if (/\.ml$/.test(control)) return 'Write the millilitres of each drink, e.g. 150.';
  const byTime = r?.when === 'every_time' || r?.when === 'at_times';
  const u = r?.unit ?? unit;
  if (/\.when\.every$/.test(control))
    return byTime ? 'Write the minutes between intakes, e.g. 20.' : `Write the distance between intakes in ${u}, e.g. 3.`;
  if (/\.when\.first$/.test(control))
    return byTime
      ? 'Write the first time as h:mm from the start, e.g. 0:40, or leave it empty.'
      : `Write the first distance in ${u}, e.g. 2, or leave it empty.`;
  if (/\.when\.at$/.test(control))
    return byTime
      ? 'Write the times as h:mm from the start, separated by commas, e.g. 0:40, 1:20.'
      : `Write the distances in ${u}, separated by commas, e.g. 4.5, 9.`;
  return 'Check this field.';
}

/** A message from the schema or the server, put into the words of the control's label. */
export function inWords(control: string, message: string, draft: PlanDraft, unit: Unit): string {
  // Internal units and names never reach the page: a message about seconds or ids asks for what the label shows.
  if (/seconds|item_id|\(bottle\)|Not a fuel item id|either a fuel item/.test(message)) return askFor(control, draft, unit);
  if (control === 'easy_pace_s_per_km' && unit === 'mi' && /per km/.test(message))
    return `Write an easy pace between ${formatPace(paceKmToMile(90))} and ${formatPace(paceKmToMile(1200))} per mi.`;
  return message;
}

export type PlanProblems = {
  /** Control name → message shown beside it. */
  fields: Record<string, string>;
  /** Problems of the form as a whole (e.g. two bottles with one name). */
  general: string[];
};

const WHOLE_FORM_WORDS: Array<[RegExp, string]> = [
  [/^bottles$/, 'Bottles'],
  [/^intakes$/, 'Intakes'],
  [/^bottles\.(\d+)\.contents$/, 'Bottle $1'],
];

function place(problems: PlanProblems, path: string, message: string, draft: PlanDraft, unit: Unit): void {
  const control = controlOf(path);
  if (control) {
    problems.fields[control] ??= inWords(control, message, draft, unit);
    return;
  }
  const words = WHOLE_FORM_WORDS.reduce<string | null>(
    (found, [re, w]) =>
      found ?? (re.test(path) ? path.replace(re, (_, n?: string) => w.replace('$1', String(Number(n) + 1))) : null),
    null,
  );
  problems.general.push(words ? `${words}: ${message}` : message);
}

/**
 * Checks the whole draft with the schema the server uses. An unreadable or missing value is answered by
 * what to write (`askFor`); a value out of range by the schema's own sentence.
 */
export function checkPlanDraft(draft: PlanDraft, unit: Unit): PlanProblems & { input: FuelPlanInput | null } {
  const problems: PlanProblems = { fields: {}, general: [] };
  // An intake's "either an item or a bottle" rule runs only once the rest of the intake reads: ask at once.
  draft.intakes.forEach((r, i) => {
    if (r.what === '') problems.fields[`intakes.${i}.what`] = askFor(`intakes.${i}.what`, draft, unit);
  });
  const parsed = FuelPlanInputSchema.safeParse(toPlanInput(draft, unit));
  if (parsed.success && Object.keys(problems.fields).length === 0) return { ...problems, input: parsed.data as FuelPlanInput };
  if (parsed.success) return { ...problems, input: null };
  for (const issue of parsed.error.issues) {
    const path = issue.path.join('.');
    const control = controlOf(path);
    if (control && issue.code === 'invalid_type') problems.fields[control] ??= askFor(control, draft, unit);
    else place(problems, path, issue.message, draft, unit);
  }
  return { ...problems, input: null };
}

/** The API's field issues (`intakes.0.item_id`) put on the controls they name, in the same words. */
export function problemsFromServer(
  issues: ReadonlyArray<{ field: string; message: string }>,
  draft: PlanDraft,
  unit: Unit,
): PlanProblems {
  const problems: PlanProblems = { fields: {}, general: [] };
  for (const { field, message } of issues) place(problems, field, message, draft, unit);
  return problems;
}
