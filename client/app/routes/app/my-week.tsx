import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { parseIsoDate } from '../../../../shared/plans/weeks.ts';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { runnerWeekQueryOptions, useRunnerWeek } from '../../../features/squad/api/get-runner-week.ts';
import { WeekReview } from '../../../features/squad/components/week-review.tsx';
import { requireUser } from '../../guards.ts';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    const user = await requireUser(queryClient, request);
    await queryClient.ensureQueryData(runnerWeekQueryOptions(user.id, parseIsoDate(params.date ?? null)));
    return null;
  };

/** The runner's own week: the same review their coach sees, with the notes between them. */
export default function MyWeekRoute() {
  const params = useParams();
  const me = useMe();
  const meId = me?.id ?? '';
  const week = useRunnerWeek(meId, parseIsoDate(params.date ?? null));
  const profile = useProfile();
  return (
    <>
      <PageHeader title="My week">
        Your week as your coach sees it: planned against run, the load, any flags, and notes between you and your coach.
      </PageHeader>
      <WeekReview week={week} unit={profile.unit} meId={meId} viewer="runner" weekHref={(date) => paths.myWeek.getHref(date)} />
    </>
  );
}
