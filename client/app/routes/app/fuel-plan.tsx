import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import { Card } from '../../../components/ui/card.tsx';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import type { FuelPlanOwner } from '../../../features/fuel/api/fuel-keys.ts';
import { fuelItemsQueryOptions, useFuelItems } from '../../../features/fuel/api/get-fuel-items.ts';
import { fuelPlanQueryOptions, useFuelPlan } from '../../../features/fuel/api/get-fuel-plan.ts';
import { fuelSessionQueryOptions } from '../../../features/fuel/api/get-fuel-session.ts';
import { FuelPlanForm } from '../../../features/fuel/components/fuel-plan-form.tsx';
import { FuelPlanResults } from '../../../features/fuel/components/fuel-plan-results.tsx';
import { goalRaceQueryOptions } from '../../../features/goals/api/get-goal-race.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';

function ownerOf(planId: string | undefined): FuelPlanOwner {
  return planId ? { kind: 'plan', planId } : { kind: 'goal' };
}

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const owner = ownerOf(params.planId);
    await Promise.all([
      queryClient.ensureQueryData(fuelPlanQueryOptions(owner)),
      owner.kind === 'plan'
        ? queryClient.ensureQueryData(fuelSessionQueryOptions(owner.planId))
        : queryClient.ensureQueryData(goalRaceQueryOptions()),
    ]);
    void queryClient.prefetchQuery(fuelItemsQueryOptions());
    return null;
  };

/** A session plan's or the goal race's fuel plan: inputs, then the computed schedule, hourly totals, cautions and meals. */
export default function FuelPlanRoute() {
  const planId = useParams().planId;
  return planId ? <SessionFuelPlan planId={planId} /> : <GoalFuelPlan />;
}

function SessionFuelPlan({ planId }: { planId: string }) {
  const session = useSuspenseQuery(fuelSessionQueryOptions(planId)).data;
  const me = useMe();
  const title = session.title || session.text;
  return (
    <FuelPlanPage
      owner={{ kind: 'plan', planId }}
      runnerId={session.runner_id === me?.id ? null : session.runner_id}
      heading={`Fuel plan: ${title}`}
      subject={`${formatLocalDate(session.date)} · ${session.text}`}
      durationFrom="the plan’s parts and target paces"
      printHref={paths.planFuelPrint.getHref(planId)}
      backHref={paths.plan.getHref({ week: session.date })}
    />
  );
}

function GoalFuelPlan() {
  const goal = useSuspenseQuery(goalRaceQueryOptions()).data;
  if (!goal) {
    return (
      <>
        <PageHeader title="Race fuel plan" />
        <EmptyState title="No goal race yet" next={<LinkButton to={paths.profile.getHref()}>Set a goal race</LinkButton>}>
          <p>A race fuel plan is timed by the goal race’s distance and goal time. Set your goal race first.</p>
        </EmptyState>
      </>
    );
  }
  return (
    <FuelPlanPage
      owner={{ kind: 'goal' }}
      runnerId={null}
      heading={`Fuel plan: ${goal.name}`}
      subject={`${formatLocalDate(goal.date)} · goal ${formatDuration(goal.goal_time_s)}`}
      durationFrom="your goal time"
      printHref={paths.goalFuelPrint.getHref()}
      backHref={paths.plan.getHref()}
    />
  );
}

type FuelPlanPageProps = {
  owner: FuelPlanOwner;
  runnerId: string | null;
  heading: string;
  subject: string;
  durationFrom: string;
  printHref: string;
  backHref: string;
};

function FuelPlanPage({ owner, runnerId, heading, subject, durationFrom, printHref, backHref }: FuelPlanPageProps) {
  const plan = useFuelPlan(owner);
  const profile = useProfile();
  const items = useFuelItems(runnerId);
  return (
    <>
      <PageHeader title={heading}>{subject}</PageHeader>
      <nav aria-label="Fuel plan links" className="-mt-2 mb-4 flex flex-wrap gap-2">
        <LinkButton to={backHref}>Back to the plan</LinkButton>
        {plan && <LinkButton to={printHref}>Printable sheet for the night before</LinkButton>}
        <LinkButton to={paths.fuel.getHref()}>Fuel items</LinkButton>
      </nav>
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] lg:items-start">
        <Card title="Inputs" description="Save to compute the schedule; change anything and save again.">
          {items.data ? (
            <FuelPlanForm
              owner={owner}
              plan={plan}
              items={items.data}
              unit={profile.unit}
              userId={profile.id}
              defaultBodyMass={profile.weight_kg}
              durationFrom={durationFrom}
            />
          ) : items.isError ? (
            <p role="alert" className="text-sm text-tartan">
              The fuel items could not be loaded: {items.error.message}
            </p>
          ) : (
            <p role="status" className="text-sm text-ink-muted">
              Loading the fuel items…
            </p>
          )}
          {items.data?.length === 0 && (
            <p className="mt-3 text-sm">
              <Link to={paths.fuel.getHref()} className="font-semibold text-teal underline underline-offset-2">
                Add your fuel items
              </Link>{' '}
              (gels, drink mixes, chews…) to plan with them.
            </p>
          )}
        </Card>
        <FuelPlanResults plan={plan} unit={profile.unit} />
      </div>
    </>
  );
}
