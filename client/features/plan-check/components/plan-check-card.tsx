import { describeSession } from '../../../../shared/plans/describe-session.ts';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Card } from '../../../components/ui/card.tsx';
import { Verdict } from '../../../components/ui/verdict.tsx';
import type { PlanCheckAnswer } from '../../../../shared/plans/plan-check-answer.ts';
import { planCheckDownloads, usePlanCheck } from '../api/get-plan-check.ts';
import { PlanCheckHow } from './plan-check-how.tsx';
import { PlanCheckTable } from './plan-check-table.tsx';
import { PlanLinkControls } from './plan-link-controls.tsx';

const LINK =
  'tap-target inline-flex items-center rounded-md border border-line bg-card px-2.5 py-1 text-sm font-semibold text-teal hover:border-teal';

type PlanCheckCardProps = {
  runId: string;
  /** The run's local date (`YYYY-MM-DD`), which picks its same-day plan. */
  localDate: string;
  unit: Unit;
  /** Only the run's owner may choose its plan. */
  isOwner: boolean;
};

/** The run against its session plan: the plan, the session verdict in a sentence, the parts table and how it is computed. */
export function PlanCheckCard({ runId, localDate, unit, isOwner }: PlanCheckCardProps) {
  const check = usePlanCheck(runId);

  if (!check.data) {
    return (
      <Card title="Plan check">
        {check.isError ? (
          <p role="alert" className="text-sm text-tartan">
            The plan check could not be loaded: {check.error.message}
          </p>
        ) : (
          <p role="status" className="py-4 text-center text-sm text-ink-muted">
            Checking the run against its session plan…
          </p>
        )}
      </Card>
    );
  }

  const data = check.data;
  return (
    <Card
      title="Plan check"
      description="Each part of the session plan against what was run."
      actions={
        data.plan && (
          <a className={LINK} href={planCheckDownloads.csv(runId)} download>
            Plan check CSV
          </a>
        )
      }
    >
      {data.plan ? (
        <div className="flex flex-col gap-4">
          <PlanHeading check={data} localDate={localDate} />
          <p className="text-base">
            <Verdict verdict={data.session_verdict}>{describeSession(data.parts, data.session_verdict)}</Verdict>
          </p>
          <PlanCheckTable check={data} unit={unit} />
          {isOwner && <PlanLinkControls runId={runId} localDate={localDate} check={data} />}
          <PlanCheckHow method={data.method} tolerance={data.tolerance} />
        </div>
      ) : (
        <div className="flex flex-col gap-4">
          <p className="text-base">
            <Verdict verdict="unplanned">No session plan on this day.</Verdict>
          </p>
          {isOwner ? (
            <PlanLinkControls runId={runId} localDate={localDate} check={data} />
          ) : (
            <p className="text-sm text-ink-muted">The runner can link this run to one of their plans.</p>
          )}
        </div>
      )}
    </Card>
  );
}

/** The plan's title, its date when it is not the run's, how it was linked, and its shorthand. */
function PlanHeading({ check, localDate }: { check: PlanCheckAnswer; localDate: string }) {
  const plan = check.plan!;
  const how = check.linked === 'chosen' ? 'chosen for this run' : 'the plan of the run’s day';
  return (
    <div>
      <p>
        <span className="font-semibold">{plan.title}</span>
        <span className="text-ink-muted">
          {' · '}
          {plan.date === localDate ? how : `plan of ${formatLocalDate(plan.date)}, ${how}`}
        </span>
      </p>
      <p className="mt-1 rounded bg-paper px-2 py-1 text-sm break-words">{plan.text}</p>
      {plan.notes && <p className="mt-1 text-sm text-ink-muted">{plan.notes}</p>}
    </div>
  );
}
