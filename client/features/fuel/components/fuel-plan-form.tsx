import { useState, type FocusEvent, type FormEvent } from 'react';
import type { Bottle, IntakeRule } from '../../../../shared/fuel/schedule.ts';
import type { FuelItem } from '../../../../shared/fuel/schemas.ts';
import { mlToUsFlOz, proposeTargets, type FuelTargets } from '../../../../shared/fuel/targets.ts';
import { formatDuration, formatPace, paceKmToMile } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CONTROL_CLASSES, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { cn } from '../../../lib/cn.ts';
import { useDraft } from '../../../lib/use-draft.ts';
import type { FuelPlanOwner } from '../api/fuel-keys.ts';
import { useSaveFuelPlan } from '../api/save-fuel-plan.ts';
import type { FuelPlan } from '../../../../shared/fuel/answers.ts';
import { bottleMix, formatAmount, formatTimeFromStart, parseRunTime, toMl, type VolumeUnit } from '../utils/fuel-format.ts';
import {
  checkPlanDraft,
  problemsFromServer,
  TARGET_KEYS,
  TARGET_WORDS,
  type BottleDraft,
  type IntakeDraft,
  type PlanDraft as Draft,
  type PlanProblems,
  type TargetDraft,
  type TargetKey,
  type WhenType,
} from '../utils/fuel-plan-draft.ts';

const WHEN_WORDS: Record<WhenType, string> = {
  every_distance: 'every so many mi or km',
  every_time: 'every so many minutes',
  at_distances: 'at given distances',
  at_times: 'at given times',
};

let nextKey = 1;
const newKey = () => nextKey++;

/** Rows restored from a draft keep their keys; new ones count on from above them. */
function reserveKeys(d: Draft): void {
  const keys = [...d.bottles.flatMap((b) => [b.key, ...b.contents.map((c) => c.key)]), ...d.intakes.map((r) => r.key)];
  nextKey = Math.max(nextKey, ...keys.map((k) => k + 1));
}

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

type FuelPlanFormProps = {
  owner: FuelPlanOwner;
  /** The signed-in user: the draft is kept per user and per plan on this device. */
  userId: string;
  plan: FuelPlan | null;
  items: readonly FuelItem[];
  unit: Unit;
  defaultBodyMass: number | null;
  /** Words for where the expected duration comes from: "the plan's parts and target paces" or "your goal time". */
  durationFrom: string;
};

const NO_PROBLEMS: PlanProblems = { fields: {}, general: [] };

const problemId = (name: string) => `fuel-plan-${name.replace(/\./g, '-')}-problem`;

/** Problems of the form as a whole, under its alert. */
function ProblemList({ problems }: { problems: readonly string[] }) {
  if (problems.length === 0) return null;
  return problems.map((p) => (
    <span key={p} className="mt-1 block">
      {p}
    </span>
  ));
}

/** Focuses the first control, in page order, whose name has a problem. */
function focusFirst(form: HTMLFormElement, names: readonly string[]): void {
  const control = Array.from(form.elements).find((el): el is HTMLInputElement => names.includes((el as HTMLInputElement).name));
  control?.focus();
}

/**
 * The inputs of a fuel plan; saving sends them and the server answers with the computed schedule. Each field is
 * checked once it has been left (and all of them on saving) with the schema the server uses, the message beside
 * the field in the words of its label; the server's answers go back to the fields they name; what is typed is
 * kept on this device until it is saved, so neither a refused save nor a reload loses it.
 */
export function FuelPlanForm({ owner, userId, plan, items, unit, defaultBodyMass, durationFrom }: FuelPlanFormProps) {
  const stored = useDraft<Draft>(`fuel-plan:${userId}:${owner.kind === 'plan' ? owner.planId : 'goal'}`, () =>
    initialDraft(plan, unit, defaultBodyMass),
  );
  const draft = stored.value;
  useState(() => reserveKeys(draft));
  const [touched, setTouched] = useState<ReadonlySet<string>>(new Set());
  const [submitted, setSubmitted] = useState(false);
  const [server, setServer] = useState<PlanProblems>(NO_PROBLEMS);
  const [saved, setSaved] = useState(false);
  const save = useSaveFuelPlan(owner);

  const check = checkPlanDraft(draft, unit);
  /** The message beside a control: the server's answer, else the check once the field was left or a save tried. */
  const problem = (name: string): string | undefined =>
    server.fields[name] ?? (submitted || touched.has(name) ? check.fields[name] : undefined);
  /** A compact control's name and its link to the message under its row. */
  const control = (name: string) =>
    problem(name) ? { name, 'aria-invalid': true as const, 'aria-describedby': problemId(name) } : { name };
  /** The messages of a row's compact controls, under the row (a grid row keeps its controls aligned). */
  const rowProblems = (names: readonly string[]) =>
    names.map((name) => {
      const message = problem(name);
      return message ? (
        <p key={name} id={problemId(name)} className="text-sm font-semibold text-tartan">
          {message}
        </p>
      ) : null;
    });

  const set = (patch: Partial<Draft>) => {
    setSaved(false);
    stored.update((d) => ({ ...d, ...patch }));
  };
  /** Removing a row renumbers the rows after it, so the server's answers no longer name the right ones. */
  const remove = (patch: Partial<Draft>) => {
    setServer(NO_PROBLEMS);
    set(patch);
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

  function onLeave(event: FocusEvent<HTMLFormElement>) {
    const name = (event.target as Element).getAttribute('name');
    if (name && !touched.has(name)) setTouched(new Set(touched).add(name));
  }

  function onEdit(event: FormEvent<HTMLFormElement>) {
    const name = (event.target as Element).getAttribute('name');
    if (name && name in server.fields)
      setServer(({ fields: { [name]: _answered, ...rest }, general }) => ({ fields: rest, general }));
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setSaved(false);
    setSubmitted(true);
    setServer(NO_PROBLEMS);
    save.reset();
    if (!check.input) {
      focusFirst(form, Object.keys(check.fields));
      return;
    }
    save.mutate(check.input, {
      onSuccess: () => {
        stored.clear();
        setSubmitted(false);
        setTouched(new Set());
        setSaved(true);
      },
      // A refusal keeps everything on screen (and in the draft) and puts the answer at the fields it names.
      onError: (error) => {
        setSubmitted(false);
        const answered = isApiError(error) ? problemsFromServer(error.fieldIssues, draft, unit) : NO_PROBLEMS;
        setServer(answered);
        focusFirst(form, Object.keys(answered.fields));
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
  const marked = Object.keys(check.fields).length;

  return (
    <form
      onSubmit={onSubmit}
      onBlur={onLeave}
      onChange={onEdit}
      noValidate
      aria-label="Fuel plan inputs"
      className="flex flex-col gap-5"
    >
      {stored.restored && !saved && (
        <div className="flex flex-col gap-2">
          <FormAlert tone="success">Restored what you entered earlier on this device; it is not saved yet.</FormAlert>
          <div>
            <Button
              variant="quiet"
              onClick={() => {
                setServer(NO_PROBLEMS);
                setSubmitted(false);
                stored.discard(initialDraft(plan, unit, defaultBodyMass));
              }}
            >
              {plan ? 'Start again from the saved plan' : 'Start again from empty'}
            </Button>
          </div>
        </div>
      )}
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-semibold">The run</legend>
        <TextField
          label="Body mass (kg)"
          name="body_mass_kg"
          inputMode="decimal"
          value={draft.bodyMass}
          error={problem('body_mass_kg')}
          onChange={(e) => set({ bodyMass: e.target.value })}
          hint="For the meal figures and caffeine per kg."
        />
        <TextField
          label="Expected duration (optional, h:mm:ss)"
          name="expected_duration_s"
          value={draft.duration}
          error={problem('expected_duration_s')}
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
          name="easy_pace_s_per_km"
          value={draft.easyPace}
          error={problem('easy_pace_s_per_km')}
          onChange={(e) => set({ easyPace: e.target.value })}
          placeholder={unit === 'mi' ? '9:30' : '5:55'}
          hint="Times the parts that have an effort or heart-rate target instead of a pace."
        />
        <TextField
          label="Start time of day (optional, HH:MM)"
          name="start_clock"
          value={draft.startClock}
          error={problem('start_clock')}
          onChange={(e) => set({ startClock: e.target.value })}
          placeholder="07:30"
        />
        <TextField
          label="Sweat rate (optional, L/h)"
          name="sweat_l_per_h"
          inputMode="decimal"
          value={draft.sweat}
          error={problem('sweat_l_per_h')}
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
                    name={`targets.${k}.low`}
                    error={problem(`targets.${k}.low`)}
                    inputMode="decimal"
                    value={t.low}
                    onChange={(e) => set({ targets: { ...draft.targets, [k]: { ...t, low: e.target.value } } })}
                  />
                  <TextField
                    label={`${words.name} high (${words.unit})`}
                    name={`targets.${k}.high`}
                    error={problem(`targets.${k}.high`)}
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
                  <input
                    className={small}
                    {...control(`bottles.${bi}.id`)}
                    value={b.name}
                    onChange={(e) => setBottle(b.key, { name: e.target.value })}
                  />
                </label>
                <label className="flex flex-col gap-1">
                  <span className={label}>Volume, bottle {n}</span>
                  <input
                    className={small}
                    {...control(`bottles.${bi}.volume_ml`)}
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
              {rowProblems([`bottles.${bi}.id`, `bottles.${bi}.volume_ml`])}
              {b.contents.map((c, ci) => (
                <div key={c.key} className="flex flex-col gap-1">
                  <div className="grid grid-cols-[1fr_6rem_auto] items-end gap-2">
                    <label className="flex flex-col gap-1">
                      <span className={label}>
                        Mixed in, bottle {n} item {ci + 1}
                      </span>
                      <select
                        className={small}
                        {...control(`bottles.${bi}.contents.${ci}.item_id`)}
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
                        {...control(`bottles.${bi}.contents.${ci}.servings`)}
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
                      onClick={() =>
                        remove({
                          bottles: draft.bottles.map((x) =>
                            x.key === b.key ? { ...x, contents: x.contents.filter((y) => y.key !== c.key) } : x,
                          ),
                        })
                      }
                    >
                      Remove
                    </Button>
                  </div>
                  {rowProblems([`bottles.${bi}.contents.${ci}.item_id`, `bottles.${bi}.contents.${ci}.servings`])}
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
                <Button variant="quiet" onClick={() => remove({ bottles: draft.bottles.filter((x) => x.key !== b.key) })}>
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
                <select
                  className={small}
                  {...control(`intakes.${ri}.what`)}
                  value={r.what}
                  onChange={(e) => setIntake(r.key, { what: e.target.value })}
                >
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
                    {...control(`intakes.${ri}.ml`)}
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
                    {...control(`intakes.${ri}.servings`)}
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
                      {...control(`intakes.${ri}.when.every`)}
                      inputMode="decimal"
                      value={r.every}
                      onChange={(e) => setIntake(r.key, { every: e.target.value })}
                    />
                  </label>
                  <label className="flex flex-col gap-1">
                    <span className={label}>
                      First at ({r.when === 'every_time' ? 'h:mm' : r.unit}, optional), intake {n}
                    </span>
                    <input
                      className={small}
                      {...control(`intakes.${ri}.when.first`)}
                      value={r.first}
                      onChange={(e) => setIntake(r.key, { first: e.target.value })}
                    />
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
                    {...control(`intakes.${ri}.when.at`)}
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
              <Button variant="quiet" onClick={() => remove({ intakes: draft.intakes.filter((x) => x.key !== r.key) })}>
                Remove intake {n}
              </Button>
              <div className="col-span-2 flex flex-col gap-1 empty:hidden sm:col-span-4">
                {rowProblems(['what', 'servings', 'ml', 'when.every', 'when.first', 'when.at'].map((f) => `intakes.${ri}.${f}`))}
              </div>
            </div>
          );
        })}
        <div>
          <Button
            variant="secondary"
            onClick={() =>
              set({
                // The picker starts empty: nothing goes into the plan that the user did not choose.
                intakes: [...draft.intakes, intakeDraft(null, unit)],
              })
            }
          >
            Add an intake
          </Button>
        </div>
      </fieldset>

      {submitted && (marked > 0 || check.general.length > 0) && (
        <FormAlert>
          Not saved yet
          {marked === 1 && ': one field needs a fix, see the message beside it'}
          {marked > 1 && `: ${marked} fields need a fix, see the messages beside them`}.
          <ProblemList problems={check.general} />
        </FormAlert>
      )}
      {save.error && (
        <FormAlert>
          Not saved:{' '}
          {Object.keys(server.fields).length > 0
            ? 'see the messages beside the fields.'
            : server.general.length > 0
              ? ''
              : save.error.message}{' '}
          Everything you entered is still here.
          <ProblemList problems={server.general} />
        </FormAlert>
      )}
      {saved && <FormAlert tone="success">Fuel plan saved. The schedule below is up to date.</FormAlert>}
      <div>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Computing…' : 'Save and compute the schedule'}
        </Button>
      </div>
    </form>
  );
}
