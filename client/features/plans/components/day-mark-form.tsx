import { useState, type FormEvent } from 'react';
import { DAY_MARK_KINDS, type DayMark, type DayMarkKind } from '../../../../shared/plans/prescribe-schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useDeleteDayMark, usePutDayMark } from '../api/day-marks.ts';
import { formatDay } from './plan-week.tsx';

const KIND_WORDS: Record<DayMarkKind, string> = {
  rest: 'Rest day',
  ill: 'Ill',
  injured: 'Injured',
  'cross-training': 'Cross-training (minutes count in the week’s time, not its distance)',
};

type DayMarkFormProps = {
  date: string;
  mark: DayMark | null;
  /** A squad runner's day (coaches); the signed-in person's own without it. */
  runnerId?: string;
  onClose: (message?: string) => void;
};

/** Marks a day as rest, ill, injured or cross-training (with minutes and a note), or clears the mark. */
export function DayMarkForm({ date, mark, runnerId, onClose }: DayMarkFormProps) {
  const [kind, setKind] = useState<DayMarkKind>(mark?.kind ?? 'rest');
  const [minutes, setMinutes] = useState(mark?.minutes ? String(mark.minutes) : '');
  const [note, setNote] = useState(mark?.note ?? '');
  const put = usePutDayMark();
  const remove = useDeleteDayMark();
  const heading = `Mark ${formatDay(date, true)}`;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const body = {
      date,
      kind,
      ...(kind === 'cross-training' ? { minutes: Number(minutes) } : {}),
      ...(note.trim() ? { note: note.trim() } : {}),
      ...(runnerId ? { runner_id: runnerId } : {}),
    };
    put.mutate(body, { onSuccess: () => onClose(`${formatDay(date)} marked: ${KIND_WORDS[kind].split(' (')[0]}.`) });
  }

  return (
    <Card
      title={heading}
      actions={
        <Button variant="quiet" onClick={() => onClose()}>
          Close
        </Button>
      }
    >
      <form onSubmit={onSubmit} noValidate aria-label={heading} className="flex flex-col gap-3">
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-[minmax(0,1fr)_8rem]">
          <SelectField label="This day is" value={kind} onChange={(e) => setKind(e.target.value as DayMarkKind)}>
            {DAY_MARK_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_WORDS[k]}
              </option>
            ))}
          </SelectField>
          {kind === 'cross-training' && (
            <TextField
              label="Minutes"
              type="number"
              inputMode="numeric"
              min={1}
              max={1440}
              value={minutes}
              onChange={(e) => setMinutes(e.target.value)}
            />
          )}
        </div>
        <TextField
          label="Note (optional)"
          value={note}
          maxLength={500}
          onChange={(e) => setNote(e.target.value)}
          placeholder="Bike, easy spin"
        />
        {(put.error ?? remove.error) && <FormAlert>{(put.error ?? remove.error)!.message}</FormAlert>}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" disabled={put.isPending}>
            Save mark
          </Button>
          {mark && (
            <Button
              variant="danger"
              disabled={remove.isPending}
              onClick={() =>
                remove.mutate(
                  { date, ...(runnerId ? { runner_id: runnerId } : {}) },
                  { onSuccess: () => onClose('Mark removed.') },
                )
              }
            >
              Remove mark
            </Button>
          )}
        </div>
      </form>
    </Card>
  );
}
