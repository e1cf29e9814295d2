import { useState, type FormEvent } from 'react';
import { CAUTIONS, coldWaterNotes } from '../../../../shared/fuel/cautions.ts';
import { CheckinInputSchema, type CheckinInput } from '../../../../shared/fuel/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, SelectField, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { cn } from '../../../lib/cn.ts';
import { useDraft } from '../../../lib/use-draft.ts';
import { useCheckin } from '../api/get-checkin.ts';
import { useSaveCheckin } from '../api/save-checkin.ts';
import type { CheckinView } from '../../../../shared/fuel/answers.ts';
import { readNumber } from '../utils/fuel-format.ts';
import { FuelCautions } from './fuel-cautions.tsx';

const SCALE = ['1', '2', '3', '4', '5'];
const COLD_WATER = [CAUTIONS['cold water']];

type Draft = {
  sleep: string;
  soreness: string;
  mood: string;
  walking: string;
  mobility: string;
  coldTemp: string;
  coldMinutes: string;
  notes: string;
};

const str = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

function ColdWaterNotes({ temp, minutes }: { temp: string; minutes: string }) {
  const t = Number(temp);
  const m = Number(minutes);
  if (temp.trim() === '' || minutes.trim() === '' || !Number.isFinite(t) || !Number.isFinite(m) || m < 0) return null;
  const notes = coldWaterNotes(t, m);
  if (notes.length === 0) return null;
  return (
    <ul className="list-disc pl-5 text-sm font-semibold text-tartan-deep">
      {notes.map((n) => (
        <li key={n}>{n}</li>
      ))}
    </ul>
  );
}

function CheckinForm({ runId, userId, view }: { runId: string; userId: string; view: CheckinView }) {
  const c = view.checkin;
  // Kept in this device's storage while typed, so a reload or a refused save loses nothing (client/README.md).
  const draft = useDraft<Draft>(`checkin:${userId}:${runId}`, () => ({
    sleep: str(c?.sleep_hours),
    soreness: str(c?.soreness),
    mood: str(c?.mood),
    walking: str(c?.walking_minutes),
    mobility: str(c?.mobility_minutes),
    coldTemp: str(c?.cold_water?.water_temp_c),
    coldMinutes: str(c?.cold_water?.minutes),
    notes: c?.notes ?? '',
  }));
  const d = draft.value;
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);
  const save = useSaveCheckin(runId);
  const set = (patch: Partial<Draft>) => {
    setSaved(false);
    draft.update((current) => ({ ...current, ...patch }));
  };
  const cold = d.coldTemp.trim() !== '' || d.coldMinutes.trim() !== '';

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const n = (t: string) => readNumber(t) ?? null;
    const parsed = CheckinInputSchema.safeParse({
      sleep_hours: n(d.sleep),
      soreness: n(d.soreness),
      mood: n(d.mood),
      walking_minutes: n(d.walking),
      mobility_minutes: n(d.mobility),
      cold_water: cold
        ? { water_temp_c: readNumber(d.coldTemp) ?? Number.NaN, minutes: readNumber(d.coldMinutes) ?? Number.NaN }
        : null,
      notes: d.notes,
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])));
      return;
    }
    setErrors({});
    save.mutate(parsed.data as CheckinInput, {
      onSuccess: () => {
        draft.clear();
        setSaved(true);
      },
    });
  }

  const scale = (label: string, value: string, key: 'soreness' | 'mood', hint: string) => (
    <SelectField label={label} value={value} error={errors[key]} hint={hint} onChange={(e) => set({ [key]: e.target.value })}>
      <option value="">not said</option>
      {SCALE.map((s) => (
        <option key={s} value={s}>
          {s}
        </option>
      ))}
    </SelectField>
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="After-run check-in" className="flex flex-col gap-4">
      {draft.restored && !saved && (
        <FormAlert tone="success">Restored what you entered earlier on this device; it is not saved yet.</FormAlert>
      )}
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        <TextField
          label="Sleep the night before (hours)"
          inputMode="decimal"
          value={d.sleep}
          error={errors.sleep_hours}
          onChange={(e) => set({ sleep: e.target.value })}
        />
        {scale('Soreness (1–5)', d.soreness, 'soreness', '1 none, 5 very sore')}
        {scale('Mood (1–5)', d.mood, 'mood', '1 low, 5 great')}
        <TextField
          label="Easy walking (minutes)"
          inputMode="decimal"
          value={d.walking}
          error={errors.walking_minutes}
          onChange={(e) => set({ walking: e.target.value })}
        />
        <TextField
          label="Mobility or band work (minutes)"
          inputMode="decimal"
          value={d.mobility}
          error={errors.mobility_minutes}
          onChange={(e) => set({ mobility: e.target.value })}
        />
      </div>
      <fieldset className="flex flex-col gap-3 rounded-md border border-line p-3">
        <legend className="px-1 text-sm font-semibold">Cold-water immersion (optional)</legend>
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Water temperature (°C)"
            inputMode="decimal"
            value={d.coldTemp}
            error={errors['cold_water.water_temp_c']}
            onChange={(e) => set({ coldTemp: e.target.value })}
          />
          <TextField
            label="Minutes in cold water"
            inputMode="decimal"
            value={d.coldMinutes}
            error={errors['cold_water.minutes']}
            onChange={(e) => set({ coldMinutes: e.target.value })}
          />
        </div>
        {cold && (
          <>
            <ColdWaterNotes temp={d.coldTemp} minutes={d.coldMinutes} />
            <FuelCautions cautions={COLD_WATER} title="Cold-water caution" headingLevel="h3" />
          </>
        )}
      </fieldset>
      <label className="flex flex-col gap-1">
        <span className="text-sm font-semibold">Check-in notes</span>
        <textarea
          className={cn(CONTROL_CLASSES, 'min-h-16 px-3 py-2')}
          value={d.notes}
          onChange={(e) => set({ notes: e.target.value })}
        />
      </label>
      {save.error && <FormAlert>{save.error.message}</FormAlert>}
      {saved && <FormAlert tone="success">Check-in saved.</FormAlert>}
      <div>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save check-in'}
        </Button>
      </div>
    </form>
  );
}

function ReadOnly({ view }: { view: CheckinView }) {
  const c = view.checkin;
  if (!c) return <p className="text-sm text-ink-muted">No check-in for this run yet.</p>;
  const v = (n: number | null, unit = '') => (n === null ? '–' : `${n}${unit}`);
  return (
    <div className="flex flex-col gap-3 text-sm">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 tabular-nums sm:grid-cols-3">
        <div>
          <dt className="text-ink-muted">Sleep the night before</dt>
          <dd>{v(c.sleep_hours, ' h')}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Soreness</dt>
          <dd>{v(c.soreness, '/5')}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Mood</dt>
          <dd>{v(c.mood, '/5')}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Easy walking</dt>
          <dd>{v(c.walking_minutes, ' min')}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Mobility or band work</dt>
          <dd>{v(c.mobility_minutes, ' min')}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Cold water</dt>
          <dd>{c.cold_water ? `${c.cold_water.water_temp_c} °C for ${c.cold_water.minutes} min` : '–'}</dd>
        </div>
      </dl>
      {c.cold_water && c.cold_water.notes.length > 0 && (
        <ul className="list-disc pl-5 font-semibold text-tartan-deep">
          {c.cold_water.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
      {c.notes && <p className="whitespace-pre-line">{c.notes}</p>}
      {view.cautions.length > 0 && <FuelCautions cautions={view.cautions} title="Cold-water caution" headingLevel="h3" />}
    </div>
  );
}

/** The after-run check-in: sleep, soreness, mood and recovery work; the runner edits it, a coach reads it. */
export function CheckinCard({ runId, userId, isOwner }: { runId: string; userId: string; isOwner: boolean }) {
  const checkin = useCheckin(runId);
  return (
    <Card title="After-run check-in" description="Sleep, soreness, mood and the recovery work you did.">
      {checkin.data ? (
        isOwner ? (
          <CheckinForm runId={runId} userId={userId} view={checkin.data} />
        ) : (
          <ReadOnly view={checkin.data} />
        )
      ) : checkin.isError ? (
        <p role="alert" className="text-sm text-tartan">
          The check-in could not be loaded: {checkin.error.message}
        </p>
      ) : (
        <p role="status" className="text-sm text-ink-muted">
          Loading…
        </p>
      )}
    </Card>
  );
}
