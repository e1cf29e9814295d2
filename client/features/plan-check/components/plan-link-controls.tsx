import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import { dateWindow } from '../../../../shared/plans/plan-check-display.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { paths } from '../../../config/paths.ts';
import type { PlanCheckAnswer } from '../../../../shared/plans/plan-check-answer.ts';
import { usePlansNear } from '../api/get-plans-near.ts';
import { useLinkRunPlan, type PlanLink } from '../api/link-run-plan.ts';

/** Plans this many days either side of the run are offered for linking. */
const DAYS_AROUND = 3;

type PlanLinkControlsProps = { runId: string; localDate: string; check: PlanCheckAnswer };

/**
 * The run's owner picks which session plan the run is checked against: one of their plans of the
 * surrounding days, none ("Unlink"), or the plan on the run's own date again. The server checks
 * ownership too.
 */
export function PlanLinkControls({ runId, localDate, check }: PlanLinkControlsProps) {
  const range = dateWindow(localDate, DAYS_AROUND);
  const plans = usePlansNear(range, true);
  const link = useLinkRunPlan();
  const [choiceError, setChoiceError] = useState<string | null>(null);

  const choosable = (plans.data ?? []).filter((plan) => plan.id !== check.plan_id);
  const hasSameDayPlan = (plans.data ?? []).some((plan) => plan.date === localDate);
  const relink = (planId: PlanLink) => link.mutate({ runId, planId });

  function onChoose(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const planId = new FormData(event.currentTarget).get('plan_id');
    if (typeof planId !== 'string' || planId === '') {
      setChoiceError('Choose a plan from the list.');
      return;
    }
    setChoiceError(null);
    relink(planId);
  }

  const busy = link.isPending;
  return (
    <div className="flex flex-col gap-3" role="group" aria-label="Which plan this run is checked against">
      {link.isError && <FormAlert>The plan was not changed: {link.error.message}</FormAlert>}
      {plans.isError && <FormAlert>Your plans of these days could not be loaded: {plans.error.message}</FormAlert>}
      {plans.isPending ? (
        <p role="status" className="text-sm text-ink-muted">
          Looking for your plans of the days around this run…
        </p>
      ) : choosable.length > 0 ? (
        <form noValidate onSubmit={onChoose} className="flex flex-col gap-2 sm:flex-row sm:items-start">
          <SelectField
            label={check.plan ? 'Check against another plan' : 'Link this run to a plan'}
            name="plan_id"
            defaultValue=""
            hint={`Your plans from ${formatLocalDate(range.from)} to ${formatLocalDate(range.to)}.`}
            error={choiceError ?? undefined}
            className="sm:max-w-md sm:flex-1"
          >
            <option value="">Choose a plan…</option>
            {choosable.map((plan) => (
              <option key={plan.id} value={plan.id}>
                {`${formatLocalDate(plan.date)} · ${plan.title}`}
              </option>
            ))}
          </SelectField>
          <Button type="submit" variant="secondary" disabled={busy} className="sm:mt-6">
            Link plan
          </Button>
        </form>
      ) : (
        !check.plan && (
          <p className="text-sm text-ink-muted">
            You have no plans from {formatLocalDate(range.from)} to {formatLocalDate(range.to)}. Write one on the{' '}
            <Link to={paths.plan.getHref()} className="font-semibold text-teal underline-offset-2 hover:underline">
              Plan page
            </Link>{' '}
            and link it here.
          </p>
        )
      )}
      {(check.plan || (hasSameDayPlan && check.linked !== 'same day')) && (
        <div className="flex flex-wrap gap-2">
          {check.plan && (
            <Button variant="secondary" disabled={busy} onClick={() => relink(null)}>
              Unlink
            </Button>
          )}
          {hasSameDayPlan && check.linked !== 'same day' && (
            <Button variant="secondary" disabled={busy} onClick={() => relink('auto')}>
              Back to the same-day plan
            </Button>
          )}
        </div>
      )}
    </div>
  );
}
