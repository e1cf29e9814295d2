import { useRef } from 'react';
import { Link } from 'react-router-dom';
import { formatDistance, formatPaceIn } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import type { WeekCheckin, WeekDayRun, WeekFuelTaken, WeekNote } from '../../../../shared/weeks/week-answer.ts';
import { Button } from '../../../components/ui/button.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { paths } from '../../../config/paths.ts';
import { CardTime, LineClockWords, type CardClock } from '../../../components/ui/zoned-time.tsx';
import { UnreadDot } from '../../notes/index.ts';
import { useReplyOnRun } from '../api/reply-on-run.ts';

const one = (x: number) => (Math.round(x * 10) / 10).toString();

type WeekRunEntryProps = {
  run: WeekDayRun;
  unit: Unit;
  meId: string;
  runnerId: string;
  /**
   * The card's clock, the runner's profile zone, named once above the days: the check-in and notes show bare times
   * on it; the start is on the run's own zone and names it only when that reads otherwise.
   */
  clock: CardClock;
};

/** One run of the week as the runner told it: figures, verdict and why, fuel, check-in, notes, and a reply box. */
export function WeekRunEntry({ run, unit, meId, runnerId, clock }: WeekRunEntryProps) {
  const pace = formatPaceIn(run.pace_s_per_km, unit);
  return (
    <div className="flex flex-col gap-1 rounded-sm bg-paper px-2 py-1" data-run-id={run.id}>
      <Link
        to={paths.run.getHref(run.id)}
        className="inline-flex tap-target items-center text-sm font-semibold text-teal tabular-nums underline-offset-2 hover:underline"
      >
        {formatDistance(run.distance_m, unit)} {unit}
        <span className="font-normal text-ink-muted"> · {run.name}</span>
      </Link>
      <p className="text-xs text-ink-muted tabular-nums">
        {/* The start as the run is dated: in the zone it was run in (the stored local time, shown as is). */}
        <time dateTime={run.started_at}>{run.local_time}</time>
        <LineClockWords iso={run.started_at} timeZone={run.time_zone} clock={clock} /> · {formatDuration(run.moving_s)} moving
        {pace && ` · ${pace}`}
        {run.trimp !== null && ` · TRIMP ${Math.round(run.trimp)}`}
        {run.avg_hr !== null && ` · ♥ ${Math.round(run.avg_hr)}`}
        {(run.goal_pace_s ?? 0) > 0 && ` · ${formatDuration(run.goal_pace_s ?? 0)} at goal pace`}
      </p>
      {run.session_verdict ? (
        <p className="text-xs">
          <Verdict verdict={run.session_verdict} />
          {run.verdict_reason && <span className="text-ink"> · {run.verdict_reason}</span>}
        </p>
      ) : (
        <span className="text-xs text-ink-muted">not checked</span>
      )}
      {run.reps_line && <p className="text-xs break-words text-ink tabular-nums">{run.reps_line}</p>}
      {run.fuel_taken && <FuelLine fuel={run.fuel_taken} />}
      {run.checkin && <CheckinLine checkin={run.checkin} clock={clock} />}
      <RunNotes notes={run.notes} meId={meId} clock={clock} />
      <ReplyBox runId={run.id} runnerId={runnerId} />
    </div>
  );
}

function FuelLine({ fuel }: { fuel: WeekFuelTaken }) {
  const taken = `${one(fuel.carbohydrate_g)} g carbs · ${one(fuel.fluid_ml)} ml · ${one(fuel.sodium_mg)} mg sodium${
    fuel.caffeine_mg > 0 ? ` · ${one(fuel.caffeine_mg)} mg caffeine` : ''
  }`;
  const planned = fuel.planned
    ? ` (planned ${one(fuel.planned.carbohydrate_g)} g · ${one(fuel.planned.fluid_ml)} ml · ${one(fuel.planned.sodium_mg)} mg)`
    : ' (no fuel plan)';
  return (
    <p className="text-xs break-words" data-part="fuel">
      <span className="font-semibold">Fuel taken:</span> {fuel.entries} {fuel.entries === 1 ? 'entry' : 'entries'}, {taken}
      {planned} · stomach {fuel.stomach ?? '–'}/5 · energy {fuel.energy ?? '–'}/5
      {fuel.notes && <span className="block whitespace-pre-wrap text-ink-muted">“{fuel.notes}”</span>}
    </p>
  );
}

function CheckinLine({ checkin, clock }: { checkin: WeekCheckin; clock: CardClock }) {
  const parts = [
    checkin.sleep_hours !== null && `sleep ${one(checkin.sleep_hours)} h`,
    checkin.soreness !== null && `soreness ${checkin.soreness}/5`,
    checkin.mood !== null && `mood ${checkin.mood}/5`,
    checkin.walking_minutes !== null && `walking ${checkin.walking_minutes} min`,
    checkin.mobility_minutes !== null && `mobility ${checkin.mobility_minutes} min`,
    checkin.cold_water_temp_c !== null &&
      checkin.cold_water_minutes !== null &&
      `cold water ${one(checkin.cold_water_temp_c)} °C for ${one(checkin.cold_water_minutes)} min`,
  ].filter(Boolean);
  const sore = (checkin.soreness ?? 0) >= 4;
  return (
    <p className="text-xs break-words" data-part="checkin">
      <span className="font-semibold">After the run:</span> {parts.join(' · ') || 'nothing filled in'}
      {sore && <span className="font-semibold text-tartan"> · high soreness</span>}
      {checkin.notes && <span className="block whitespace-pre-wrap text-ink-muted">“{checkin.notes}”</span>}
      <span className="block text-ink-muted">
        checked in <CardTime iso={checkin.updated_at} clock={clock} />
      </span>
    </p>
  );
}

function RunNotes({ notes, meId, clock }: { notes: WeekNote[]; meId: string; clock: CardClock }) {
  if (notes.length === 0) return null;
  return (
    <ol className="flex flex-col gap-1" aria-label="Notes on this run">
      {notes.map((note) => (
        <li key={note.id} className="rounded-sm border border-line bg-white px-2 py-1 text-xs" data-note-id={note.id}>
          <p className="text-ink-muted">
            <span className="font-semibold text-ink">{note.author.id === meId ? 'You' : note.author.name}</span> ·{' '}
            <CardTime iso={note.created_at} clock={clock} />
            {note.concern && <span className="font-semibold text-tartan"> · about {note.concern}</span>}{' '}
            {note.unread && <UnreadDot />}
          </p>
          <p className="mt-0.5 break-words whitespace-pre-wrap">{note.text}</p>
        </li>
      ))}
    </ol>
  );
}

/** Reply on the run in one step: write and send; the note goes on the run and to the other side. */
function ReplyBox({ runId, runnerId }: { runId: string; runnerId: string }) {
  const reply = useReplyOnRun(runId, runnerId);
  const formRef = useRef<HTMLFormElement>(null);
  return (
    <form
      ref={formRef}
      className="flex flex-col gap-1"
      aria-label="Reply on this run"
      onSubmit={(event) => {
        event.preventDefault();
        const text = String(new FormData(event.currentTarget).get('text') ?? '').trim();
        if (text) reply.mutate(text, { onSuccess: () => formRef.current?.reset() });
      }}
    >
      <label className="sr-only" htmlFor={`reply-${runId}`}>
        Note on this run
      </label>
      <textarea
        id={`reply-${runId}`}
        name="text"
        rows={1}
        maxLength={4000}
        placeholder="Reply on this run…"
        className="min-h-11 w-full rounded-sm border border-line bg-white px-2 py-1 text-base lg:text-sm"
      />
      <Button type="submit" variant="secondary" disabled={reply.isPending} className="self-start">
        {reply.isPending ? 'Sending…' : 'Send'}
      </Button>
      {reply.isError && <FormAlert>{reply.error.message}</FormAlert>}
    </form>
  );
}
