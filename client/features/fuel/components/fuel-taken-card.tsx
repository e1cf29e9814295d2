import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { isApiError } from '../../../lib/api-client.ts';
import { useDraft } from '../../../lib/use-draft.ts';
import type { Amounts } from '../../../../shared/fuel/schedule.ts';
import { FuelTakenInputSchema, type FuelItem, type FuelTakenInput } from '../../../../shared/fuel/schemas.ts';
import type { PlannedVsTaken, TakenEntry } from '../../../../shared/fuel/taken.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { ResponsiveTable, type TableColumn } from '../../../components/ui/responsive-table.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, SelectField, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { cn } from '../../../lib/cn.ts';
import { fuelItemsQueryOptions } from '../api/get-fuel-items.ts';
import { useFuelTaken } from '../api/get-fuel-taken.ts';
import { useRunFuelPlan } from '../api/get-run-fuel-plan.ts';
import { useSaveFuelTaken } from '../api/save-fuel-taken.ts';
import type { FuelPlan, FuelTakenView } from '../../../../shared/fuel/answers.ts';
import { formatAmount, formatTimeFromStart, parseRunTime, readNumber } from '../utils/fuel-format.ts';
import { FuelCautions } from './fuel-cautions.tsx';

type EntryDraft = {
  key: number;
  kind: 'item' | 'water' | 'drink';
  itemId: string;
  /** The plan's bottle a drink came from. */
  bottle: string;
  name: string;
  amount: string;
  time: string;
  /** Index of the planned intake this entry ticks off, if any. */
  planned: number | null;
};

let nextKey = 1;

/** Entries restored from a draft keep their keys; new ones count on from above them. */
function reserveKeys(entries: readonly EntryDraft[]): void {
  nextKey = Math.max(nextKey, ...entries.map((e) => e.key + 1));
}

const SCALE = ['1', '2', '3', '4', '5'];

function entryDraft(e: TakenEntry, planned: number | null): EntryDraft {
  return {
    key: nextKey++,
    kind: e.kind,
    itemId: e.item_id ?? '',
    bottle: e.bottle ?? '',
    name: e.name,
    amount: String(e.kind === 'item' ? (e.servings ?? 1) : e.fluid_ml),
    time: e.time_s === null ? '' : formatTimeFromStart(e.time_s),
    planned,
  };
}

/** The planned intakes a runner can tick off: items taken by hand and drinks from the plan's bottles. */
function plannedIntakes(plan: FuelPlan | undefined) {
  return (plan?.schedule.intakes ?? []).flatMap((x, index) => (x.item_id || x.bottle ? [{ ...x, index }] : []));
}

/** Whether a recorded entry is the planned intake `p` (same item or bottle, within a minute of its time). */
function isPlannedEntry(p: ReturnType<typeof plannedIntakes>[number], e: TakenEntry): boolean {
  const same = e.kind === 'drink' ? p.bottle !== null && p.bottle === e.bottle : p.item_id !== null && p.item_id === e.item_id;
  return same && e.time_s !== null && Math.abs(p.time_s - e.time_s) < 60;
}

/** The amount field of an entry: millilitres for water and drinks, servings for items. */
function amountWord(kind: EntryDraft['kind']): 'ml' | 'servings' {
  return kind === 'item' ? 'servings' : 'ml';
}

/** The amount field's label, in the words the runner reads. */
function amountLabel(kind: EntryDraft['kind']): string {
  return kind === 'item' ? 'Servings' : 'Millilitres (ml)';
}

type EntryProblems = { item?: string; amount?: string; time?: string };
const TIME_WORDS = 'Write the time as h:mm from the start, e.g. 1:15.';

/** An entry as the API takes it (NaN where the text is not a number, so the schema names the field). */
function entryPayload(e: EntryDraft) {
  const amount = readNumber(e.amount) ?? Number.NaN;
  const time_s = e.time.trim() === '' ? null : (parseRunTime(e.time) ?? Number.NaN);
  if (e.kind === 'water') return { kind: 'water', fluid_ml: amount, time_s };
  if (e.kind === 'drink') return { kind: 'drink', bottle: e.bottle, fluid_ml: amount, time_s };
  return { kind: 'item', item_id: e.itemId, servings: amount, time_s };
}

/** Field problems of one entry, checked by the same schema the server uses, worded for its fields. */
function checkEntry(e: EntryDraft): EntryProblems {
  const problems: EntryProblems = {};
  if (e.time.trim() !== '' && parseRunTime(e.time) === null) problems.time = TIME_WORDS;
  const amount = readNumber(e.amount);
  if (amount === undefined || Number.isNaN(amount))
    problems.amount =
      e.kind === 'item' ? 'Write the servings as a number, e.g. 1 or 0.5.' : 'Write the millilitres as a number, e.g. 150.';
  const parsed = FuelTakenInputSchema.safeParse({ entries: [entryPayload(e)], stomach: null, energy: null, notes: '' });
  for (const issue of parsed.success ? [] : parsed.error.issues) {
    const field = issue.path[2];
    if (field === 'time_s') problems.time ??= issue.message;
    else if (field === 'servings' || field === 'fluid_ml') problems.amount ??= issue.message;
    else if (field === 'item_id' || field === 'bottle') problems.item ??= issue.message;
  }
  return problems;
}

const hasProblems = (p: EntryProblems | undefined) => Boolean(p && (p.item || p.amount || p.time));

/** The API's field issues (`entries.3.item_id`) put back on the entries they name. */
function problemsFromServer(error: unknown, entries: readonly EntryDraft[]): Record<number, EntryProblems> {
  const out: Record<number, EntryProblems> = {};
  if (!isApiError(error)) return out;
  for (const { field, message } of error.fieldIssues) {
    const m = /^entries\.(\d+)\.(\w+)$/.exec(field ?? '');
    const entry = m ? entries[Number(m[1])] : undefined;
    if (!m || !entry) continue;
    const slot = m[2] === 'time_s' ? 'time' : m[2] === 'servings' || m[2] === 'fluid_ml' ? 'amount' : 'item';
    out[entry.key] = { ...out[entry.key], [slot]: slot === 'time' && /seconds/.test(message) ? TIME_WORDS : message };
  }
  return out;
}

type AmountsLine = { label: string; planned: Amounts; taken: Amounts };
const AMOUNTS: ReadonlyArray<{ key: keyof Amounts; words: string }> = [
  { key: 'carbohydrate_g', words: 'carbs g' },
  { key: 'fluid_ml', words: 'fluid ml' },
  { key: 'sodium_mg', words: 'sodium mg' },
  { key: 'caffeine_mg', words: 'caffeine mg' },
];
/** Hour, then planned and taken per nutrient; phones show the carbohydrate, a row opens into the rest. */
const AMOUNT_COLUMNS: TableColumn<AmountsLine>[] = [
  { id: 'hour', header: 'hour', primary: true, rowHeader: true, cell: (r) => r.label },
  ...AMOUNTS.flatMap(({ key, words }): TableColumn<AmountsLine>[] => [
    {
      id: `${key}-planned`,
      header: `${words} planned`,
      align: 'right',
      primary: key === 'carbohydrate_g',
      cell: (r) => formatAmount(r.planned[key]),
    },
    {
      id: `${key}-taken`,
      header: `${words} taken`,
      align: 'right',
      primary: key === 'carbohydrate_g',
      cell: (r) => formatAmount(r.taken[key]),
    },
  ]),
];

/** Planned vs taken per clock hour: carbohydrate, fluid, sodium and caffeine side by side. */
export function PlannedVsTakenTable({ data }: { data: PlannedVsTaken }) {
  const zero = (a: Amounts) => a.carbohydrate_g + a.fluid_ml + a.sodium_mg + a.caffeine_mg === 0;
  const none: Amounts = { carbohydrate_g: 0, fluid_ml: 0, sodium_mg: 0, caffeine_mg: 0 };
  const rows: AmountsLine[] = [
    ...data.hours.map((h) => ({
      label: `${formatTimeFromStart(h.from_s)}–${formatTimeFromStart(h.to_s)}`,
      planned: h.planned,
      taken: h.taken,
    })),
    ...(zero(data.untimed) ? [] : [{ label: 'no time given', planned: none, taken: data.untimed }]),
    { label: 'whole run', planned: data.totals.planned, taken: data.totals.taken },
  ];
  return (
    <ResponsiveTable
      caption="Planned and taken per hour"
      columns={AMOUNT_COLUMNS}
      rows={rows}
      rowKey={(r) => r.label}
      rowLabel={(r) => r.label}
    />
  );
}

function ReadOnly({ view }: { view: FuelTakenView }) {
  const taken = view.fuel_taken;
  if (!taken) return <p className="text-sm text-ink-muted">Nothing recorded for this run yet.</p>;
  return (
    <div className="flex flex-col gap-2 text-sm">
      <ul className="flex flex-col gap-1 tabular-nums">
        {taken.entries.map((e, i) => (
          <li key={i}>
            {e.time_s === null ? 'no time' : formatTimeFromStart(e.time_s)} ·{' '}
            {e.kind === 'item' ? `${e.name} ×${e.servings}` : `${e.name} ${formatAmount(e.fluid_ml)} ml`}
          </li>
        ))}
      </ul>
      <p>
        Stomach {taken.stomach ?? '–'}/5 · energy {taken.energy ?? '–'}/5
      </p>
      {taken.notes && <p className="whitespace-pre-line">{taken.notes}</p>}
    </div>
  );
}

type FuelTakenFormProps = {
  runId: string;
  userId: string;
  view: FuelTakenView;
  items: readonly FuelItem[];
  plan: FuelPlan | undefined;
  unit: Unit;
};

type Extra = { what: string; amount: string; time: string };
type TakenDraft = { entries: EntryDraft[]; stomach: string; energy: string; notes: string; extra: Extra };

function FuelTakenForm({ runId, userId, view, items, plan, unit }: FuelTakenFormProps) {
  const planned = plannedIntakes(plan);
  // Everything typed is kept in this device's storage until saved, so a reload or a refused save loses nothing.
  const draft = useDraft<TakenDraft>(`fuel-taken:${userId}:${runId}`, () => ({
    entries: (view.fuel_taken?.entries ?? []).map((e) => entryDraft(e, planned.find((p) => isPlannedEntry(p, e))?.index ?? null)),
    stomach: String(view.fuel_taken?.stomach ?? ''),
    energy: String(view.fuel_taken?.energy ?? ''),
    notes: view.fuel_taken?.notes ?? '',
    // The extra-item picker starts empty: nothing goes on the record that the runner did not choose.
    extra: { what: '', amount: '', time: '' },
  }));
  const { entries, stomach, energy, notes, extra } = draft.value;
  useState(() => reserveKeys(entries));
  const patch = (change: Partial<TakenDraft>) => draft.update((d) => ({ ...d, ...change }));
  const setEntries = (change: (es: EntryDraft[]) => EntryDraft[]) => draft.update((d) => ({ ...d, entries: change(d.entries) }));
  const [extraProblems, setExtraProblems] = useState<EntryProblems & { what?: string }>({});
  const [serverProblems, setServerProblems] = useState<Record<number, EntryProblems>>({});
  const [submitted, setSubmitted] = useState(false);
  const [saved, setSaved] = useState(false);
  const save = useSaveFuelTaken(runId);
  const small = cn(CONTROL_CLASSES, 'w-full px-2 py-1.5 text-sm');
  const problems = (e: EntryDraft): EntryProblems => ({ ...checkEntry(e), ...serverProblems[e.key] });
  const editEntry = (key: number, change: Partial<EntryDraft>) => {
    setSaved(false);
    setServerProblems(({ [key]: _done, ...rest }) => rest);
    setEntries((es) => es.map((x) => (x.key === key ? { ...x, ...change } : x)));
  };

  const tick = (p: (typeof planned)[number], on: boolean) => {
    setSaved(false);
    setEntries((es) =>
      on
        ? [
            ...es,
            // A drink is recorded by the ml from its bottle (editable: half a drink is half of each nutrient).
            p.bottle !== null
              ? {
                  key: nextKey++,
                  kind: 'drink',
                  itemId: '',
                  bottle: p.bottle,
                  name: `bottle ${p.bottle}`,
                  amount: String(p.ml ?? ''),
                  time: formatTimeFromStart(p.time_s),
                  planned: p.index,
                }
              : {
                  key: nextKey++,
                  kind: 'item',
                  itemId: p.item_id!,
                  bottle: '',
                  name: p.label,
                  amount: String(p.servings ?? 1),
                  time: formatTimeFromStart(p.time_s),
                  planned: p.index,
                },
          ]
        : es.filter((e) => e.planned !== p.index),
    );
  };

  const extraKind: EntryDraft['kind'] = extra.what === 'water' ? 'water' : 'item';
  function addExtra() {
    setSaved(false);
    const item = items.find((i) => `item:${i.id}` === extra.what);
    const entry: EntryDraft = {
      key: nextKey++,
      kind: extraKind,
      itemId: item?.id ?? '',
      bottle: '',
      name: extraKind === 'water' ? 'water' : (item?.name ?? ''),
      amount: extra.amount,
      time: extra.time,
      planned: null,
    };
    const found = {
      ...checkEntry(entry),
      what: extra.what === '' ? 'Choose what you took: one of your fuel items or water.' : undefined,
    };
    setExtraProblems(found);
    if (found.what || hasProblems(found)) return;
    patch({ entries: [...entries, entry], extra: { what: extra.what, amount: '', time: '' } });
  }

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    setSubmitted(true);
    if (entries.some((e) => hasProblems(checkEntry(e)))) return;
    const parsed = FuelTakenInputSchema.safeParse({
      entries: entries.map(entryPayload),
      stomach: stomach === '' ? null : Number(stomach),
      energy: energy === '' ? null : Number(energy),
      notes,
    });
    if (!parsed.success) return;
    save.mutate(parsed.data as FuelTakenInput, {
      onSuccess: () => {
        draft.clear();
        setServerProblems({});
        setSaved(true);
      },
      // A refusal keeps every entry on screen (and in the draft) and puts the answer at the fields it names.
      onError: (error) => setServerProblems(problemsFromServer(error, entries)),
    });
  }

  const marked = entries.filter((e) => hasProblems(problems(e))).length;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Fuel taken" className="flex flex-col gap-4">
      {draft.restored && !saved && (
        <FormAlert tone="success">Restored what you entered earlier on this device; it is not saved yet.</FormAlert>
      )}
      {planned.length > 0 && (
        <fieldset className="flex flex-col gap-1">
          <legend className="mb-1 text-sm font-semibold">Planned: tick what you took</legend>
          {planned.map((p) => (
            <label key={p.index} className="flex min-h-11 items-center gap-2 text-sm tabular-nums sm:min-h-6">
              <input
                type="checkbox"
                className="size-5 shrink-0"
                checked={entries.some((e) => e.planned === p.index)}
                onChange={(e) => tick(p, e.target.checked)}
              />
              {p.label} at {unit} {(unit === 'mi' ? p.distance_mi : p.distance_km).toFixed(2)} ({p.clock})
            </label>
          ))}
        </fieldset>
      )}

      <section aria-label="Recorded intakes" className="flex flex-col gap-2">
        <h3 className="text-sm font-semibold">Recorded</h3>
        {entries.length === 0 && (
          <p className="text-sm text-ink-muted">Nothing yet: tick planned intakes or add what you took.</p>
        )}
        {entries.map((e, i) => {
          const p = problems(e);
          const id = `fuel-entry-${e.key}`;
          return (
            <div key={e.key} className="flex flex-col gap-1">
              <div className="grid grid-cols-[1fr_5.5rem_5.5rem_auto] items-end gap-2 text-sm">
                <span className="pb-2 font-semibold" aria-describedby={p.item ? `${id}-item` : undefined}>
                  {e.kind === 'water' ? 'water' : e.name}
                </span>
                <label className="flex flex-col gap-1">
                  <span className="text-xs">{amountWord(e.kind)}</span>
                  <input
                    className={small}
                    inputMode="decimal"
                    aria-label={`${amountLabel(e.kind)}, entry ${i + 1}`}
                    aria-invalid={p.amount ? true : undefined}
                    aria-describedby={p.amount ? `${id}-amount` : undefined}
                    value={e.amount}
                    onChange={(ev) => editEntry(e.key, { amount: ev.target.value })}
                  />
                </label>
                <label className="flex flex-col gap-1">
                  <span className="text-xs">time h:mm</span>
                  <input
                    className={small}
                    aria-label={`Time, entry ${i + 1}`}
                    aria-invalid={p.time ? true : undefined}
                    aria-describedby={p.time ? `${id}-time` : undefined}
                    value={e.time}
                    onChange={(ev) => editEntry(e.key, { time: ev.target.value })}
                  />
                </label>
                <Button variant="quiet" onClick={() => setEntries((es) => es.filter((x) => x.key !== e.key))}>
                  Remove entry {i + 1}
                </Button>
              </div>
              {p.item && (
                <p id={`${id}-item`} className="text-sm font-semibold text-tartan">
                  {e.name}: {p.item}
                </p>
              )}
              {p.amount && (
                <p id={`${id}-amount`} className="text-sm font-semibold text-tartan">
                  {amountLabel(e.kind)}: {p.amount}
                </p>
              )}
              {p.time && (
                <p id={`${id}-time`} className="text-sm font-semibold text-tartan">
                  Time: {p.time}
                </p>
              )}
            </div>
          );
        })}
      </section>

      <fieldset className="grid grid-cols-1 items-start gap-2 rounded-md border border-line p-3 sm:grid-cols-4">
        <legend className="px-1 text-sm font-semibold">Add something else</legend>
        <SelectField
          label="What you took"
          value={extra.what}
          error={extraProblems.what}
          onChange={(e) => {
            setExtraProblems({});
            patch({ extra: { ...extra, what: e.target.value } });
          }}
        >
          <option value="">Choose…</option>
          {items.map((i) => (
            <option key={i.id} value={`item:${i.id}`}>
              {i.name}
            </option>
          ))}
          <option value="water">water</option>
        </SelectField>
        <TextField
          label={extra.what === '' ? 'Amount' : amountLabel(extraKind)}
          inputMode="decimal"
          value={extra.amount}
          error={extraProblems.amount}
          placeholder={extraKind === 'water' ? '150' : '1'}
          onChange={(e) => {
            setExtraProblems((x) => ({ ...x, amount: undefined }));
            patch({ extra: { ...extra, amount: e.target.value } });
          }}
        />
        <TextField
          label="Time (h:mm from the start)"
          value={extra.time}
          error={extraProblems.time}
          onChange={(e) => {
            setExtraProblems((x) => ({ ...x, time: undefined }));
            patch({ extra: { ...extra, time: e.target.value } });
          }}
          placeholder="1:15"
        />
        <Button variant="secondary" className="sm:mt-6" onClick={addExtra}>
          Add to the record
        </Button>
      </fieldset>

      <div className="grid grid-cols-2 gap-3">
        <SelectField
          label="Stomach (1–5)"
          value={stomach}
          onChange={(e) => patch({ stomach: e.target.value })}
          hint="1 upset, 5 settled"
        >
          <option value="">not said</option>
          {SCALE.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Energy (1–5)"
          value={energy}
          onChange={(e) => patch({ energy: e.target.value })}
          hint="1 empty, 5 strong"
        >
          <option value="">not said</option>
          {SCALE.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </SelectField>
      </div>
      <label className="flex flex-col gap-1">
        <span className="text-sm font-semibold">Fuel notes</span>
        <textarea
          className={cn(CONTROL_CLASSES, 'min-h-16 px-3 py-2')}
          value={notes}
          onChange={(e) => patch({ notes: e.target.value })}
        />
      </label>
      {submitted && marked > 0 && (
        <FormAlert>
          {marked === 1 ? 'One entry needs' : `${marked} entries need`} a fix before saving: see the messages beside them.
        </FormAlert>
      )}
      {save.error && <FormAlert>Not saved: {save.error.message} Everything you entered is still here.</FormAlert>}
      {saved && <FormAlert tone="success">Fuel taken saved.</FormAlert>}
      <div>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save fuel taken'}
        </Button>
      </div>
    </form>
  );
}

type FuelTakenCardProps = { runId: string; userId: string; localDate: string; isOwner: boolean; unit: Unit };

/** What was taken on the run and how it went; planned vs taken per hour when the run's session or race has a fuel plan. */
export function FuelTakenCard({ runId, userId, localDate, isOwner, unit }: FuelTakenCardProps) {
  const taken = useFuelTaken(runId);
  const items = useQuery({ ...fuelItemsQueryOptions(), enabled: isOwner });
  const plan = useRunFuelPlan(localDate, taken.data?.planned_vs_taken?.fuel_plan_id ?? null);
  const view = taken.data;
  return (
    <Card title="Fuel taken" description="What you took on this run, and how your stomach and energy held up.">
      {!view ? (
        taken.isError ? (
          <p role="alert" className="text-sm text-tartan">
            Fuel taken could not be loaded: {taken.error.message}
          </p>
        ) : (
          <p role="status" className="text-sm text-ink-muted">
            Loading…
          </p>
        )
      ) : (
        <div className="flex flex-col gap-4">
          {isOwner ? (
            items.data ? (
              <FuelTakenForm
                key={plan?.id ?? 'no-plan'}
                runId={runId}
                userId={userId}
                view={view}
                items={items.data}
                plan={plan}
                unit={unit}
              />
            ) : (
              <p role="status" className="text-sm text-ink-muted">
                Loading your fuel items…
              </p>
            )
          ) : (
            <ReadOnly view={view} />
          )}
          {view.planned_vs_taken && (
            <section aria-labelledby={`pvt-${runId}`} className="flex flex-col gap-2">
              <h3 id={`pvt-${runId}`} className="font-semibold">
                Planned vs taken per hour
              </h3>
              <PlannedVsTakenTable data={view.planned_vs_taken} />
            </section>
          )}
          {view.cautions.length > 0 && <FuelCautions cautions={view.cautions} headingLevel="h3" />}
        </div>
      )}
    </Card>
  );
}
