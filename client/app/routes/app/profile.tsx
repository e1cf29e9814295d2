import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient } from '@tanstack/react-query';
import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { tokensQueryOptions } from '../../../features/api-tokens/api/get-tokens.ts';
import { DeleteAccountCard } from '../../../features/account/components/delete-account-card.tsx';
import { YourDataCard } from '../../../features/account/components/your-data-card.tsx';
import { ApiTokensCard } from '../../../features/api-tokens/components/api-tokens-card.tsx';
import { authKeys } from '../../../features/auth/api/auth-keys.ts';
import { calendarFeedQueryOptions } from '../../../features/calendar/api/calendar-feed.ts';
import { CalendarFeedCard } from '../../../features/calendar/components/calendar-feed-card.tsx';
import { PasswordAndSessionsCard } from '../../../features/auth/components/password-and-sessions-card.tsx';
import { myCoachesQueryOptions } from '../../../features/coaches/api/get-my-coaches.ts';
import { MyFeesCard } from '../../../features/fees/components/my-fees-card.tsx';
import { CoachesCard } from '../../../features/coaches/components/coaches-card.tsx';
import { goalRaceQueryOptions } from '../../../features/goals/api/get-goal-race.ts';
import { raceResultsQueryOptions } from '../../../features/goals/api/get-race-results.ts';
import { GoalRaceCard } from '../../../features/goals/components/goal-race-card.tsx';
import { RaceResultsCard } from '../../../features/goals/components/race-results-card.tsx';
import { OutboxLink } from '../../../features/outbox/components/outbox-link.tsx';
import { planCheckKeys } from '../../../features/plan-check/api/plan-check-keys.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { noticeSwitchesQueryOptions } from '../../../features/profile/api/notice-switches.ts';
import { NoticeSwitchesCard } from '../../../features/profile/components/notice-switches-card.tsx';
import { PaceToleranceForm } from '../../../features/profile/components/pace-tolerance-form.tsx';
import { ProfileForm } from '../../../features/profile/components/profile-form.tsx';
import { WeekAndLoadForm } from '../../../features/profile/components/week-and-load-form.tsx';
import { formatOnDevice } from '../../../lib/format.ts';
import { DeviceClockNote } from '../../../components/ui/zoned-time.tsx';
import { todayIn } from '../../../../shared/runs/local-time.ts';

export const createLoader = (queryClient: QueryClient) => async () => {
  // prefetch, not ensure: a failing list shows its error in its card, not instead of the page.
  await Promise.all([
    queryClient.prefetchQuery(tokensQueryOptions()),
    queryClient.prefetchQuery(goalRaceQueryOptions()),
    queryClient.prefetchQuery(raceResultsQueryOptions()),
    queryClient.prefetchQuery(myCoachesQueryOptions()),
    queryClient.prefetchQuery(calendarFeedQueryOptions()),
    queryClient.prefetchQuery(noticeSwitchesQueryOptions()),
  ]);
  return null;
};

export default function ProfileRoute() {
  const profile = useProfile();
  const queryClient = useQueryClient();
  // Race paces and the tolerance change every plan check.
  const refreshPlanChecks = () => queryClient.invalidateQueries({ queryKey: planCheckKeys.all });

  return (
    <>
      <PageHeader title="Profile">
        Your account, the numbers your splits, zones and plan checks are based on, and access for scripts.
      </PageHeader>
      <div className="grid max-w-3xl gap-4">
        <Card title="Account">
          <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1">
            <dt className="text-ink-muted">E-mail</dt>
            <dd className="break-all">{profile.email}</dd>
            <dt className="text-ink-muted">Role</dt>
            <dd className="capitalize">{profile.role}</dd>
            <dt className="text-ink-muted">Member since</dt>
            <dd>{formatOnDevice(profile.created_at)}</dd>
          </dl>
          <p className="mt-3 text-sm text-ink-muted">Distances show in the unit picked with the mi | km switch at the top.</p>
          <DeviceClockNote />
        </Card>
        <Card title="About you">
          {/* The name also shows in the profile menu, which reads the session user. */}
          <ProfileForm onSaved={() => queryClient.invalidateQueries({ queryKey: authKeys.me() })} />
        </Card>
        <GoalRaceCard unit={profile.unit} today={todayIn(profile.time_zone)} onChanged={refreshPlanChecks} />
        <RaceResultsCard unit={profile.unit} today={todayIn(profile.time_zone)} onChanged={refreshPlanChecks} />
        <Card
          title="Plan check tolerance"
          description="How far from a session plan’s target pace a part may be and still count as on pace. You or your coach can change it."
        >
          <PaceToleranceForm onSaved={refreshPlanChecks} />
        </Card>
        <Card title="Week and load">
          <WeekAndLoadForm />
        </Card>
        {profile.role === 'runner' && <CoachesCard myId={profile.id} />}
        {profile.role === 'runner' && <MyFeesCard />}
        <NoticeSwitchesCard role={profile.role} />
        <CalendarFeedCard isCoach={profile.role === 'coach'} />
        <PasswordAndSessionsCard />
        <ApiTokensCard />
        <YourDataCard />
        <OutboxLink />
        <DeleteAccountCard role={profile.role} />
      </div>
    </>
  );
}
