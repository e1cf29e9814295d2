import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import { Button } from '../../../components/ui/button.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { paths } from '../../../config/paths.ts';
import type { FuelPlanOwner } from '../../../features/fuel/api/fuel-keys.ts';
import { fuelPlanQueryOptions, useFuelPlan } from '../../../features/fuel/api/get-fuel-plan.ts';
import { fuelSessionQueryOptions } from '../../../features/fuel/api/get-fuel-session.ts';
import { FuelPrintSheet } from '../../../features/fuel/components/fuel-print-sheet.tsx';
import { goalRaceQueryOptions } from '../../../features/goals/api/get-goal-race.ts';
import { profileQueryOptions, useProfile } from '../../../features/profile/api/get-profile.ts';
import { requireUser } from '../../guards.ts';

// Black on white, no app chrome, margins that fit both A4 and US Letter.
const PRINT_CSS = `
@page { margin: 14mm; }
@media print {
  html, body { background: #fff !important; color: #000 !important; }
  a { color: #000; text-decoration: none; }
}
`;

function ownerOf(planId: string | undefined): FuelPlanOwner {
  return planId ? { kind: 'plan', planId } : { kind: 'goal' };
}

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    const owner = ownerOf(params.planId);
    await Promise.all([
      queryClient.ensureQueryData(profileQueryOptions()),
      queryClient.ensureQueryData(fuelPlanQueryOptions(owner)),
      owner.kind === 'plan'
        ? queryClient.ensureQueryData(fuelSessionQueryOptions(owner.planId))
        : queryClient.ensureQueryData(goalRaceQueryOptions()),
    ]);
    return null;
  };

/** The printable fuel plan: what to lay out the night before, the bottles, the times, the cautions. */
export default function FuelPrintRoute() {
  const planId = useParams().planId;
  return planId ? <SessionSheet planId={planId} /> : <GoalSheet />;
}

function SessionSheet({ planId }: { planId: string }) {
  const session = useSuspenseQuery(fuelSessionQueryOptions(planId)).data;
  return (
    <Sheet
      owner={{ kind: 'plan', planId }}
      title={session.title || session.text}
      subject={`${formatLocalDate(session.date)} · ${session.text}`}
      backHref={paths.planFuel.getHref(planId)}
    />
  );
}

function GoalSheet() {
  const goal = useSuspenseQuery(goalRaceQueryOptions()).data;
  return (
    <Sheet
      owner={{ kind: 'goal' }}
      title={goal?.name ?? 'Goal race'}
      subject={goal ? `${formatLocalDate(goal.date)} · goal ${formatDuration(goal.goal_time_s)}` : ''}
      backHref={paths.goalFuel.getHref()}
    />
  );
}

function Sheet({ owner, title, subject, backHref }: { owner: FuelPlanOwner; title: string; subject: string; backHref: string }) {
  const plan = useFuelPlan(owner);
  const profile = useProfile();
  return (
    <main className="mx-auto max-w-4xl bg-card p-4 text-ink sm:p-8 print:max-w-none print:bg-white print:p-0 print:text-black">
      <style>{PRINT_CSS}</style>
      <title>{`Fuel plan: ${title} · Pacewright`}</title>
      <div className="mb-4 flex flex-wrap gap-2 print:hidden">
        <Button onClick={() => window.print()}>Print</Button>
        <LinkButton to={backHref}>Back to the fuel plan</LinkButton>
      </div>
      <header className="mb-3 border-b border-line-strong pb-2 print:border-black">
        <p className="text-xs tracking-wide uppercase">Pacewright · the night before</p>
        <h1 className="text-2xl font-bold">Fuel plan: {title}</h1>
        {subject && <p>{subject}</p>}
      </header>
      {plan ? <FuelPrintSheet plan={plan} unit={profile.unit} /> : <p>There is no fuel plan to print yet: save one first.</p>}
    </main>
  );
}
