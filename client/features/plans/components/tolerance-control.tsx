import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useSetPaceTolerance } from '../api/runner-summary.ts';

/** The runner's plan-check tolerance in per cent (±0.5–10 %), set by the runner or their coach. */
export function ToleranceControl({
  runnerId,
  runnerName,
  tolerance,
}: {
  runnerId: string;
  runnerName: string;
  tolerance: number;
}) {
  const [percent, setPercent] = useState(String(Math.round(tolerance * 1000) / 10));
  const mutation = useSetPaceTolerance();
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    mutation.mutate({ runnerId, pace_tolerance: Number(percent) / 100 });
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Plan-check tolerance" className="flex flex-wrap items-end gap-2">
      <TextField
        label={`Plan-check tolerance for ${runnerName} (± %)`}
        type="number"
        inputMode="decimal"
        step={0.5}
        min={0.5}
        max={10}
        value={percent}
        onChange={(e) => setPercent(e.target.value)}
        hint="How far from the target pace still counts as on pace."
        className="w-64 max-w-full"
      />
      <Button type="submit" variant="secondary" disabled={mutation.isPending}>
        Save tolerance
      </Button>
      {mutation.isSuccess && (
        <p role="status" className="text-sm text-teal">
          Saved: ±{Math.round(mutation.data.pace_tolerance * 1000) / 10} %.
        </p>
      )}
      {mutation.error && <FormAlert>{mutation.error.message}</FormAlert>}
    </form>
  );
}
