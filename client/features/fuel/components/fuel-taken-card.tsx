import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
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
import type { FuelPlan, FuelTakenView } from '../api/types.ts';
import { formatAmount, formatHoursMinutes, parseRunTime, readNumber } from '../utils/fuel-format.ts';
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

const SCALE = ['1', '2', '3', '4', '5'];

function entryDraft(e: TakenEntry, planned: number | null): EntryDraft {
  return {
    key: nextKey++,
    kind: e.kind,
    itemId: e.item_id ?? '',
    bottle: e.bottle ?? '',
    name: e.name,
    amount: String(e.kind === 'item' ? (e.servings ?? 1) : e.fluid_ml),
    time: e.time_s === null ? '' : formatHoursMinutes(e.time_s),
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
      label: `${formatHoursMinutes(h.from_s)}–${formatHoursMinutes(h.to_s)}`,
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
            {e.time_s === null ? 'no time' : formatHoursMinutes(e.time_s)} ·{' '}
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
  view: FuelTakenView;
  items: readonly FuelItem[];
  plan: FuelPlan | undefined;
  unit: Unit;
};

function FuelTakenForm({ runId, view, items, plan, unit }: FuelTakenFormProps) {
  const planned = plannedIntakes(plan);
  const [entries, setEntries] = useState<EntryDraft[]>(() =>
    (view.fuel_taken?.entries ?? []).map((e) => entryDraft(e, planned.find((p) => isPlannedEntry(p, e))?.index ?? null)),
  );
  const [stomach, setStomach] = useState(String(view.fuel_taken?.stomach ?? ''));
  const [energy, setEnergy] = useState(String(view.fuel_taken?.energy ?? ''));
  const [notes, setNotes] = useState(view.fuel_taken?.notes ?? '');
  const [extra, setExtra] = useState({ what: items[0] ? `item:${items[0].id}` : 'water', amount: '1', time: '' });
  const [errors, setErrors] = useState<string[]>([]);
  const [saved, setSaved] = useState(false);
  const save = useSaveFuelTaken(runId);
  const small = cn(CONTROL_CLASSES, 'w-full px-2 py-1.5 text-sm');

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
                  time: formatHoursMinutes(p.time_s),
                  planned: p.index,
                }
              : {
                  key: nextKey++,
                  kind: 'item',
                  itemId: p.item_id!,
                  bottle: '',
                  name: p.label,
                  amount: String(p.servings ?? 1),
                  time: formatHoursMinutes(p.time_s),
                  planned: p.index,
                },
          ]
        : es.filter((e) => e.planned !== p.index),
    );
  };

  function addExtra() {
    setSaved(false);
    const isWater = extra.what === 'water';
    const item = items.find((i) => `item:${i.id}` === extra.what);
    setEntries((es) => [
      ...es,
      {
        key: nextKey++,
        kind: isWater ? 'water' : 'item',
        itemId: item?.id ?? '',
        bottle: '',
        name: isWater ? 'water' : (item?.name ?? ''),
        amount: extra.amount,
        time: extra.time,
        planned: null,
      },
    ]);
    setExtra({ ...extra, time: '' });
  }

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const time = (t: string) => (t.trim() === '' ? null : (parseRunTime(t) ?? Number.NaN));
    const parsed = FuelTakenInputSchema.safeParse({
      entries: entries.map((e) => {
        const amount = readNumber(e.amount) ?? Number.NaN;
        if (e.kind === 'water') return { kind: 'water', fluid_ml: amount, time_s: time(e.time) };
        if (e.kind === 'drink') return { kind: 'drink', bottle: e.bottle, fluid_ml: amount, time_s: time(e.time) };
        return { kind: 'item', item_id: e.itemId, servings: amount, time_s: time(e.time) };
      }),
      stomach: stomach === '' ? null : Number(stomach),
      energy: energy === '' ? null : Number(energy),
      notes,
    });
    if (!parsed.success) {
      setErrors(
        parsed.error.issues.map((i) => (i.path[0] === 'entries' ? `Entry ${Number(i.path[1]) + 1}: ${i.message}` : i.message)),
      );
      return;
    }
    setErrors([]);
    save.mutate(parsed.data as FuelTakenInput, { onSuccess: () => setSaved(true) });
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Fuel taken" className="flex flex-col gap-4">
      {planned.length > 0 && (
        <fieldset className="flex flex-col gap-1">
          <legend className="mb-1 text-sm font-semibold">Planned: tick what you took</legend>
          {planned.map((p) => (
            <label key={p.index} className="flex items-center gap-2 text-sm tabular-nums">
              <input
                type="checkbox"
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
        {entries.map((e, i) => (
          <div key={e.key} className="grid grid-cols-[1fr_5rem_5rem_auto] items-end gap-2 text-sm">
            <span className="pb-2 font-semibold">{e.kind === 'water' ? 'water' : e.name}</span>
            <label className="flex flex-col gap-1">
              <span className="text-xs">{amountWord(e.kind)}</span>
              <input
                className={small}
                inputMode="decimal"
                aria-label={`${amountWord(e.kind) === 'ml' ? 'Ml' : 'Servings'}, entry ${i + 1}`}
                value={e.amount}
                onChange={(ev) => setEntries(entries.map((x) => (x.key === e.key ? { ...x, amount: ev.target.value } : x)))}
              />
            </label>
            <label className="flex flex-col gap-1">
              <span className="text-xs">time h:mm</span>
              <input
                className={small}
                aria-label={`Time, entry ${i + 1}`}
                value={e.time}
                onChange={(ev) => setEntries(entries.map((x) => (x.key === e.key ? { ...x, time: ev.target.value } : x)))}
              />
            </label>
            <Button variant="quiet" onClick={() => setEntries(entries.filter((x) => x.key !== e.key))}>
              Remove entry {i + 1}
            </Button>
          </div>
        ))}
      </section>

      <fieldset className="grid grid-cols-2 items-end gap-2 rounded-md border border-line p-3 sm:grid-cols-4">
        <legend className="px-1 text-sm font-semibold">Add something else</legend>
        <SelectField label="Extra item" value={extra.what} onChange={(e) => setExtra({ ...extra, what: e.target.value })}>
          {items.map((i) => (
            <option key={i.id} value={`item:${i.id}`}>
              {i.name}
            </option>
          ))}
          <option value="water">water</option>
        </SelectField>
        <TextField
          label={extra.what === 'water' ? 'Ml' : 'Servings'}
          inputMode="decimal"
          value={extra.amount}
          onChange={(e) => setExtra({ ...extra, amount: e.target.value })}
        />
        <TextField
          label="Time (h:mm from the start)"
          value={extra.time}
          onChange={(e) => setExtra({ ...extra, time: e.target.value })}
          placeholder="1:15"
        />
        <Button variant="secondary" onClick={addExtra}>
          Add to the record
        </Button>
      </fieldset>

      <div className="grid grid-cols-2 gap-3">
        <SelectField label="Stomach (1–5)" value={stomach} onChange={(e) => setStomach(e.target.value)} hint="1 upset, 5 settled">
          <option value="">not said</option>
          {SCALE.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </SelectField>
        <SelectField label="Energy (1–5)" value={energy} onChange={(e) => setEnergy(e.target.value)} hint="1 empty, 5 strong">
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
          onChange={(e) => setNotes(e.target.value)}
        />
      </label>
      {errors.length > 0 && (
        <FormAlert>
          {errors.map((e) => (
            <span key={e} className="block">
              {e}
            </span>
          ))}
        </FormAlert>
      )}
      {save.error && <FormAlert>{save.error.message}</FormAlert>}
      {saved && <FormAlert tone="success">Fuel taken saved.</FormAlert>}
      <div>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save fuel taken'}
        </Button>
      </div>
    </form>
  );
}

type FuelTakenCardProps = { runId: string; localDate: string; isOwner: boolean; unit: Unit };

/** What was taken on the run and how it went; planned vs taken per hour when the run's session or race has a fuel plan. */
export function FuelTakenCard({ runId, localDate, isOwner, unit }: FuelTakenCardProps) {
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
              <FuelTakenForm key={plan?.id ?? 'no-plan'} runId={runId} view={view} items={items.data} plan={plan} unit={unit} />
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
