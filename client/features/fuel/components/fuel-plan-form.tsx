import { useState, type FormEvent } from 'react';
import type { Bottle, IntakeRule } from '../../../../shared/fuel/schedule.ts';
import { FuelPlanInputSchema, type FuelItem, type FuelPlanInput } from '../../../../shared/fuel/schemas.ts';
import { mlToUsFlOz, proposeTargets, type FuelTargets } from '../../../../shared/fuel/targets.ts';
import { formatDuration, formatPace, paceKmToMile, paceMileToKm } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CONTROL_CLASSES, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { cn } from '../../../lib/cn.ts';
import type { FuelPlanOwner } from '../api/fuel-keys.ts';
import { useSaveFuelPlan } from '../api/save-fuel-plan.ts';
import type { FuelPlan } from '../api/types.ts';
import {
  bottleMix,
  formatAmount,
  formatTimeFromStart,
  parsePace,
  parseRunTime,
  readNumber,
  splitList,
  toMl,
  type VolumeUnit,
} from '../utils/fuel-format.ts';

const TARGET_KEYS = ['carbohydrate', 'fluid', 'sodium'] as const;
type TargetKey = (typeof TARGET_KEYS)[number];
const TARGET_WORDS: Record<TargetKey, { name: string; unit: string }> = {
  carbohydrate: { name: 'Carbohydrate', unit: 'g/h' },
  fluid: { name: 'Fluid', unit: 'ml/h' },
  sodium: { name: 'Sodium', unit: 'mg/h' },
};

type WhenType = IntakeRule['when']['type'];
const WHEN_WORDS: Record<WhenType, string> = {
  every_distance: 'every so many mi or km',
  every_time: 'every so many minutes',
  at_distances: 'at given distances',
  at_times: 'at given times',
};

type IntakeDraft = {
  key: number;
  /** `item:<id>` or `bottle:<name>`. */
  what: string;
  servings: string;
  ml: string;
  when: WhenType;
  every: string;
  unit: Unit;
  first: string;
  at: string;
};
type ContentDraft = { key: number; itemId: string; servings: string };
type BottleDraft = { key: number; name: string; volume: string; volumeUnit: VolumeUnit; contents: ContentDraft[] };
type TargetDraft = { own: boolean; low: string; high: string };
type Draft = {
  bodyMass: string;
  duration: string;
  easyPace: string;
  startClock: string;
  sweat: string;
  targets: Record<TargetKey, TargetDraft>;
  bottles: BottleDraft[];
  intakes: IntakeDraft[];
};

let nextKey = 1;
const newKey = () => nextKey++;

const str = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

function clockOf(s: number): string {
  return formatTimeFromStart(s);
}

function intakeDraft(rule: IntakeRule | null, unit: Unit): IntakeDraft {
  const base: IntakeDraft = {
    key: newKey(),
    what: '',
    servings: '1',
    ml: '150',
    when: 'every_distance',
    every: '',
    unit,
    first: '',
    at: '',
  };
  if (!rule) return base;
  const w = rule.when;
  const d: IntakeDraft = {
    ...base,
    what: rule.bottle !== undefined ? `bottle:${rule.bottle}` : `item:${rule.item_id ?? ''}`,
    servings: str(rule.servings ?? 1),
    ml: str(rule.ml ?? 150),
    when: w.type,
  };
  if (w.type === 'every_distance') return { ...d, every: str(w.every), unit: w.unit, first: str(w.first) };
  if (w.type === 'every_time')
    return { ...d, every: str(w.every_s / 60), first: w.first_s === undefined ? '' : clockOf(w.first_s) };
  if (w.type === 'at_distances') return { ...d, unit: w.unit, at: w.at.join(', ') };
  return { ...d, at: w.at_s.map(clockOf).join(', ') };
}

function initialDraft(plan: FuelPlan | null, unit: Unit, defaultBodyMass: number | null): Draft {
  const pace = plan?.easy_pace_s_per_km ?? null;
  const target = (k: TargetKey): TargetDraft => {
    const t = plan?.targets[k];
    return t && t.evidence === 'set' ? { own: true, low: str(t.low), high: str(t.high) } : { own: false, low: '', high: '' };
  };
  return {
    bodyMass: str(plan?.body_mass_kg ?? defaultBodyMass),
    duration: plan?.expected_duration_given ? formatDuration(plan.expected_duration_s) : '',
    easyPace: pace === null ? '' : formatPace(unit === 'mi' ? paceKmToMile(pace) : pace),
    startClock: plan?.start_clock ?? '',
    sweat: str(plan?.sweat_l_per_h),
    targets: { carbohydrate: target('carbohydrate'), fluid: target('fluid'), sodium: target('sodium') },
    bottles: (plan?.bottles ?? []).map((b: Bottle) => ({
      key: newKey(),
      name: b.id,
      volume: str(b.volume_ml),
      volumeUnit: 'ml' as VolumeUnit,
      contents: b.contents.map((c) => ({ key: newKey(), itemId: c.item_id, servings: str(c.servings) })),
    })),
    intakes: (plan?.intakes ?? []).map((r) => intakeDraft(r, unit)),
  };
}

/** Reads the draft into the API's input; text that does not read as a number becomes NaN so the schema names it. */
function toInput(d: Draft, unit: Unit): unknown {
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

type Issue = { field: string; message: string };

/** "intakes.0.when.every" → "intake 1, every". */
function fieldWords(field: string): string {
  return field
    .replace(/^intakes\.(\d+)/, (_, i: string) => `intake ${Number(i) + 1}`)
    .replace(/^bottles\.(\d+)/, (_, i: string) => `bottle ${Number(i) + 1}`)
    .replace(/contents\.(\d+)/, (_, i: string) => `item ${Number(i) + 1}`)
    .replace(/\./g, ', ')
    .replace(/_/g, ' ');
}

type FuelPlanFormProps = {
  owner: FuelPlanOwner;
  plan: FuelPlan | null;
  items: readonly FuelItem[];
  unit: Unit;
  defaultBodyMass: number | null;
  /** Words for where the expected duration comes from: "the plan's parts and target paces" or "your goal time". */
  durationFrom: string;
};

/** The inputs of a fuel plan; saving sends them and the server answers with the computed schedule. */
export function FuelPlanForm({ owner, plan, items, unit, defaultBodyMass, durationFrom }: FuelPlanFormProps) {
  const [draft, setDraft] = useState<Draft>(() => initialDraft(plan, unit, defaultBodyMass));
  const [issues, setIssues] = useState<Issue[]>([]);
  const [saved, setSaved] = useState(false);
  const save = useSaveFuelPlan(owner);

  const set = (patch: Partial<Draft>) => {
    setSaved(false);
    setDraft((d) => ({ ...d, ...patch }));
  };
  const setIntake = (key: number, patch: Partial<IntakeDraft>) =>
    set({ intakes: draft.intakes.map((r) => (r.key === key ? { ...r, ...patch } : r)) });
  const setBottle = (key: number, patch: Partial<BottleDraft>) =>
    set({ bottles: draft.bottles.map((b) => (b.key === key ? { ...b, ...patch } : b)) });

  // Proposals: the saved plan's, or computed here from a duration the runner typed, before the first save.
  const typedDuration = parseRunTime(draft.duration);
  const mass = Number(draft.bodyMass);
  let proposed: FuelTargets | null = plan?.proposed_targets ?? null;
  if (typedDuration && typedDuration > 0 && mass > 0 && (!plan || typedDuration !== plan.expected_duration_s)) {
    const sweat = Number(draft.sweat);
    proposed = proposeTargets({
      duration_s: typedDuration,
      body_mass_kg: mass,
      sweat_l_per_h: draft.sweat.trim() !== '' && sweat >= 0 ? sweat : undefined,
    });
  }

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const parsed = FuelPlanInputSchema.safeParse(toInput(draft, unit));
    if (!parsed.success) {
      setIssues(parsed.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })));
      return;
    }
    setIssues([]);
    save.mutate(parsed.data as FuelPlanInput, {
      onSuccess: () => setSaved(true),
      onError: (error) => {
        if (isApiError(error) && error.fieldIssues.length > 0) setIssues(error.fieldIssues);
      },
    });
  }

  const itemOptions = items.map((i) => (
    <option key={i.id} value={`item:${i.id}`}>
      {i.name}
      {i.serving ? ` (${i.serving})` : ''}
    </option>
  ));
  const small = cn(CONTROL_CLASSES, 'w-full px-2 py-1.5 text-sm');
  const label = 'text-sm font-semibold';

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Fuel plan inputs" className="flex flex-col gap-5">
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-semibold">The run</legend>
        <TextField
          label="Body mass (kg)"
          inputMode="decimal"
          value={draft.bodyMass}
          onChange={(e) => set({ bodyMass: e.target.value })}
          hint="For the meal figures and caffeine per kg."
        />
        <TextField
          label="Expected duration (optional, h:mm:ss)"
          value={draft.duration}
          onChange={(e) => set({ duration: e.target.value })}
          placeholder={plan ? formatDuration(plan.expected_duration_s) : '2:30:00'}
          hint={
            plan && !plan.expected_duration_given
              ? `From ${durationFrom}: ${formatDuration(plan.expected_duration_s)}. Type your own to override it.`
              : `Leave empty to time it from ${durationFrom}.`
          }
        />
        <TextField
          label={`Easy pace (m:ss per ${unit}, where needed)`}
          value={draft.easyPace}
          onChange={(e) => set({ easyPace: e.target.value })}
          placeholder={unit === 'mi' ? '9:30' : '5:55'}
          hint="Times the parts that have an effort or heart-rate target instead of a pace."
        />
        <TextField
          label="Start time of day (optional, HH:MM)"
          value={draft.startClock}
          onChange={(e) => set({ startClock: e.target.value })}
          placeholder="07:30"
        />
        <TextField
          label="Sweat rate (optional, L/h)"
          inputMode="decimal"
          value={draft.sweat}
          onChange={(e) => set({ sweat: e.target.value })}
          hint="From weighing before and after a run: it narrows the fluid range."
        />
      </fieldset>

      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 font-semibold">Targets per hour</legend>
        {TARGET_KEYS.map((k) => {
          const words = TARGET_WORDS[k];
          const t = draft.targets[k];
          const p = proposed?.[k];
          return (
            <div key={k} className="rounded-md border border-line p-3">
              <p className="text-sm">
                <span className="font-semibold">{words.name}</span>
                {p ? (
                  <>
                    {' '}
                    proposed{' '}
                    <span className="tabular-nums">
                      {formatAmount(p.low)}–{p.high === null ? 'no upper figure' : formatAmount(p.high)} {p.unit}
                    </span>
                  </>
                ) : (
                  <span className="text-ink-muted"> proposed when the expected duration is known (save, or type one).</span>
                )}
              </p>
              {p && (
                <>
                  <p className="text-xs text-ink-muted">
                    Source: {p.source} <span className="font-semibold">({p.evidence})</span>
                  </p>
                  <p className="text-xs text-ink-muted">{p.note}</p>
                </>
              )}
              <label className="mt-2 flex tap-target items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  checked={t.own}
                  onChange={(e) =>
                    set({
                      targets: {
                        ...draft.targets,
                        [k]: {
                          own: e.target.checked,
                          low: t.low || (p ? String(p.low) : ''),
                          high: t.high || (p?.high != null ? String(p.high) : ''),
                        },
                      },
                    })
                  }
                />
                Set my own {words.name.toLowerCase()} range
              </label>
              {t.own && (
                <div className="mt-2 grid grid-cols-2 gap-2">
                  <TextField
                    label={`${words.name} low (${words.unit})`}
                    inputMode="decimal"
                    value={t.low}
                    onChange={(e) => set({ targets: { ...draft.targets, [k]: { ...t, low: e.target.value } } })}
                  />
                  <TextField
                    label={`${words.name} high (${words.unit})`}
                    inputMode="decimal"
                    value={t.high}
                    onChange={(e) => set({ targets: { ...draft.targets, [k]: { ...t, high: e.target.value } } })}
                  />
                </div>
              )}
            </div>
          );
        })}
      </fieldset>

      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 font-semibold">Bottles</legend>
        {draft.bottles.length === 0 && <p className="text-sm text-ink-muted">No bottles. Add one to plan drinks by the ml.</p>}
        {draft.bottles.map((b, bi) => {
          const v = Number(b.volume);
          const ml = v > 0 ? toMl(v, b.volumeUnit) : 0;
          const mix = bottleMix(
            ml,
            b.contents.map((c) => ({ item_id: c.itemId, servings: Number(c.servings) })),
            items,
          );
          const n = bi + 1;
          return (
            <div
              key={b.key}
              role="group"
              aria-label={`Bottle ${n}`}
              className="flex flex-col gap-2 rounded-md border border-line p-3"
            >
              <div className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
                <label className="flex flex-col gap-1">
                  <span className={label}>Name, bottle {n}</span>
                  <input className={small} value={b.name} onChange={(e) => setBottle(b.key, { name: e.target.value })} />
                </label>
                <label className="flex flex-col gap-1">
                  <span className={label}>Volume, bottle {n}</span>
                  <input
                    className={small}
                    inputMode="decimal"
                    value={b.volume}
                    onChange={(e) => setBottle(b.key, { volume: e.target.value })}
                  />
                </label>
                <label className="flex flex-col gap-1">
                  <span className={label}>Unit, bottle {n}</span>
                  <select
                    className={small}
                    value={b.volumeUnit}
                    onChange={(e) => setBottle(b.key, { volumeUnit: e.target.value as VolumeUnit })}
                  >
                    <option value="ml">ml</option>
                    <option value="fl oz">US fl oz</option>
                  </select>
                </label>
              </div>
              {b.contents.map((c, ci) => (
                <div key={c.key} className="grid grid-cols-[1fr_6rem_auto] items-end gap-2">
                  <label className="flex flex-col gap-1">
                    <span className={label}>
                      Mixed in, bottle {n} item {ci + 1}
                    </span>
                    <select
                      className={small}
                      value={c.itemId}
                      onChange={(e) =>
                        setBottle(b.key, {
                          contents: b.contents.map((x) => (x.key === c.key ? { ...x, itemId: e.target.value } : x)),
                        })
                      }
                    >
                      <option value="">Choose an item</option>
                      {items.map((i) => (
                        <option key={i.id} value={i.id}>
                          {i.name}
                        </option>
                      ))}
                    </select>
                  </label>
                  <label className="flex flex-col gap-1">
                    <span className={label}>Servings</span>
                    <input
                      className={small}
                      inputMode="decimal"
                      value={c.servings}
                      aria-label={`Servings, bottle ${n} item ${ci + 1}`}
                      onChange={(e) =>
                        setBottle(b.key, {
                          contents: b.contents.map((x) => (x.key === c.key ? { ...x, servings: e.target.value } : x)),
                        })
                      }
                    />
                  </label>
                  <Button
                    variant="quiet"
                    aria-label={`Remove item ${ci + 1} from bottle ${n}`}
                    onClick={() => setBottle(b.key, { contents: b.contents.filter((x) => x.key !== c.key) })}
                  >
                    Remove
                  </Button>
                </div>
              ))}
              <p className="text-sm tabular-nums" aria-live="polite">
                {mix ? (
                  <>
                    {formatAmount(ml)} ml ({formatAmount(mlToUsFlOz(ml), { digits: 1 })} US fl oz):{' '}
                    {formatAmount(mix.carbohydrate_g, { digits: 1 })} g carbohydrate (
                    {formatAmount(mix.carbohydrate_pct, { digits: 1 })} %), {formatAmount(mix.sodium_mg)} mg sodium (
                    {formatAmount(mix.sodium_mg_per_l)} mg/L)
                    {mix.caffeine_mg > 0 && `, ${formatAmount(mix.caffeine_mg)} mg caffeine`}
                    {b.contents.length === 0 && ' — plain water'}
                  </>
                ) : (
                  <span className="text-ink-muted">Give the volume to see the concentration.</span>
                )}
              </p>
              <div className="flex flex-wrap gap-2">
                <Button
                  variant="secondary"
                  onClick={() => setBottle(b.key, { contents: [...b.contents, { key: newKey(), itemId: '', servings: '1' }] })}
                  disabled={items.length === 0}
                >
                  Mix in an item
                </Button>
                <Button variant="quiet" onClick={() => set({ bottles: draft.bottles.filter((x) => x.key !== b.key) })}>
                  Remove bottle {n}
                </Button>
              </div>
            </div>
          );
        })}
        <div>
          <Button
            variant="secondary"
            onClick={() =>
              set({
                bottles: [
                  ...draft.bottles,
                  {
                    key: newKey(),
                    name: String.fromCharCode(65 + draft.bottles.length),
                    volume: '500',
                    volumeUnit: 'ml',
                    contents: [],
                  },
                ],
              })
            }
          >
            Add a bottle
          </Button>
        </div>
      </fieldset>

      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 font-semibold">Intakes</legend>
        {items.length === 0 && (
          <p className="text-sm text-ink-muted">You have no fuel items yet: add them under “Fuel items” first.</p>
        )}
        {draft.intakes.map((r, ri) => {
          const n = ri + 1;
          const isBottle = r.what.startsWith('bottle:');
          const distance = r.when === 'every_distance' || r.when === 'at_distances';
          return (
            <div
              key={r.key}
              role="group"
              aria-label={`Intake ${n}`}
              className="grid grid-cols-2 items-end gap-2 rounded-md border border-line p-3 sm:grid-cols-4"
            >
              <label className="col-span-2 flex flex-col gap-1">
                <span className={label}>What, intake {n}</span>
                <select className={small} value={r.what} onChange={(e) => setIntake(r.key, { what: e.target.value })}>
                  <option value="">Choose an item or a bottle</option>
                  {itemOptions}
                  {draft.bottles
                    .filter((b) => b.name.trim())
                    .map((b) => (
                      <option key={b.key} value={`bottle:${b.name.trim()}`}>
                        a drink from bottle {b.name.trim()}
                      </option>
                    ))}
                </select>
              </label>
              {isBottle ? (
                <label className="flex flex-col gap-1">
                  <span className={label}>Ml each, intake {n}</span>
                  <input
                    className={small}
                    inputMode="decimal"
                    value={r.ml}
                    onChange={(e) => setIntake(r.key, { ml: e.target.value })}
                  />
                </label>
              ) : (
                <label className="flex flex-col gap-1">
                  <span className={label}>Servings, intake {n}</span>
                  <input
                    className={small}
                    inputMode="decimal"
                    value={r.servings}
                    onChange={(e) => setIntake(r.key, { servings: e.target.value })}
                  />
                </label>
              )}
              <label className="flex flex-col gap-1">
                <span className={label}>When, intake {n}</span>
                <select
                  className={small}
                  value={r.when}
                  onChange={(e) => setIntake(r.key, { when: e.target.value as WhenType, every: '', first: '', at: '' })}
                >
                  {(Object.keys(WHEN_WORDS) as WhenType[]).map((w) => (
                    <option key={w} value={w}>
                      {WHEN_WORDS[w]}
                    </option>
                  ))}
                </select>
              </label>
              {(r.when === 'every_distance' || r.when === 'every_time') && (
                <>
                  <label className="flex flex-col gap-1">
                    <span className={label}>
                      Every ({r.when === 'every_time' ? 'minutes' : r.unit}), intake {n}
                    </span>
                    <input
                      className={small}
                      inputMode="decimal"
                      value={r.every}
                      onChange={(e) => setIntake(r.key, { every: e.target.value })}
                    />
                  </label>
                  <label className="flex flex-col gap-1">
                    <span className={label}>
                      First at ({r.when === 'every_time' ? 'h:mm' : r.unit}, optional), intake {n}
                    </span>
                    <input className={small} value={r.first} onChange={(e) => setIntake(r.key, { first: e.target.value })} />
                  </label>
                </>
              )}
              {(r.when === 'at_distances' || r.when === 'at_times') && (
                <label className="col-span-2 flex flex-col gap-1">
                  <span className={label}>
                    At ({r.when === 'at_times' ? 'h:mm, separated by commas' : `${r.unit}, separated by commas`}), intake {n}
                  </span>
                  <input
                    className={small}
                    value={r.at}
                    placeholder={r.when === 'at_times' ? '0:40, 1:20' : '4.5, 9, 13.5'}
                    onChange={(e) => setIntake(r.key, { at: e.target.value })}
                  />
                </label>
              )}
              {distance && (
                <label className="flex flex-col gap-1">
                  <span className={label}>Unit, intake {n}</span>
                  <select className={small} value={r.unit} onChange={(e) => setIntake(r.key, { unit: e.target.value as Unit })}>
                    <option value="mi">mi</option>
                    <option value="km">km</option>
                  </select>
                </label>
              )}
              <Button variant="quiet" onClick={() => set({ intakes: draft.intakes.filter((x) => x.key !== r.key) })}>
                Remove intake {n}
              </Button>
            </div>
          );
        })}
        <div>
          <Button
            variant="secondary"
            onClick={() =>
              set({
                intakes: [...draft.intakes, { ...intakeDraft(null, unit), what: items[0] ? `item:${items[0].id}` : '' }],
              })
            }
          >
            Add an intake
          </Button>
        </div>
      </fieldset>

      {issues.length > 0 && (
        <FormAlert>
          The plan cannot be saved yet:
          <ul className="mt-1 list-disc pl-5">
            {issues.map((i) => (
              <li key={`${i.field}-${i.message}`}>
                {i.field ? `${fieldWords(i.field)}: ` : ''}
                {i.message}
              </li>
            ))}
          </ul>
        </FormAlert>
      )}
      {save.error && issues.length === 0 && <FormAlert>{save.error.message}</FormAlert>}
      {saved && <FormAlert tone="success">Fuel plan saved. The schedule below is up to date.</FormAlert>}
      <div>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Computing…' : 'Save and compute the schedule'}
        </Button>
      </div>
    </form>
  );
}
