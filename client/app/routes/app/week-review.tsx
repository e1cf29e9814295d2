import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { parseIsoDate } from '../../../../shared/plans/weeks.ts';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { runnerWeekQueryOptions, useRunnerWeek } from '../../../features/squad/api/get-runner-week.ts';
import { WeekReview } from '../../../features/squad/components/week-review.tsx';
import { requireAccess } from '../../guards.ts';
import { runnerSummaryQueryOptions, useRunnerSummary } from '../../../features/plans/api/runner-summary.ts';
import { ToleranceControl } from '../../../features/plans/components/tolerance-control.tsx';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireAccess(queryClient, request, 'squads:manage');
    await Promise.all([
      queryClient.ensureQueryData(runnerWeekQueryOptions(params.runnerId ?? '', parseIsoDate(params.date ?? null))),
      queryClient.ensureQueryData(runnerSummaryQueryOptions(params.runnerId ?? '')),
    ]);
    return null;
  };

/** A coach's review of one squad runner's week. */
export default function WeekReviewRoute() {
  const params = useParams();
  const runnerId = params.runnerId ?? '';
  const week = useRunnerWeek(runnerId, parseIsoDate(params.date ?? null));
  const me = useMe();
  const profile = useProfile();
  const runner = useRunnerSummary(runnerId);
  return (
    <>
      <PageHeader title={week.runner.name}>
        Week review: what was planned and what was run, the load, flags to look at, and your notes with the runner.
      </PageHeader>
      <WeekReview
        week={week}
        unit={profile.unit}
        meId={me?.id ?? ''}
        viewer="coach"
        weekHref={(date) => paths.weekReview.getHref(runnerId, date ?? week.today)}
        lead={
          <div className="flex flex-col gap-3">
            <div className="flex flex-wrap gap-4">
              <Link
                to={paths.squad.getHref({ week: week.start })}
                className="inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
              >
                ← All runners
              </Link>
              <Link
                to={paths.runnerPlan.getHref(runnerId, { week: week.start })}
                className="inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
              >
                Open {week.runner.name}’s plan
              </Link>
            </div>
            <ToleranceControl runnerId={runnerId} runnerName={runner.name} tolerance={runner.pace_tolerance} />
          </div>
        }
      />
    </>
  );
}
