import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { addDays, mondayOf, parseIsoDate } from '../../../../shared/plans/weeks.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { SquadFeesCard } from '../../../features/fees/components/squad-fees-card.tsx';
import { NewNotesCard } from '../../../features/notes/components/new-notes-card.tsx';
import { profileQueryOptions, useProfile } from '../../../features/profile/api/get-profile.ts';
import { todayIn } from '../../../../shared/runs/local-time.ts';
import {
  squadOverviewCsvHref,
  squadOverviewQueryOptions,
  useSquadOverview,
} from '../../../features/squad/api/get-squad-overview.ts';
import { squadsQueryOptions, useSquads } from '../../../features/squad/api/get-squads.ts';
import { useSendDigest } from '../../../features/squad/api/send-digest.ts';
import type { SquadDetail } from '../../../features/squad/api/types.ts';
import { CreateSquadForm } from '../../../features/squad/components/create-squad-form.tsx';
import { DigestReceipt } from '../../../features/squad/components/digest-receipt.tsx';
import { InviteForm } from '../../../features/squad/components/invite-form.tsx';
import { SquadOverviewHow } from '../../../features/squad/components/squad-overview-how.tsx';
import { SquadOverviewTable } from '../../../features/squad/components/squad-overview-table.tsx';
import { SquadPeople } from '../../../features/squad/components/squad-people.tsx';
import { DownloadLink } from '../../../components/ui/download-link.tsx';
import { WeekNav } from '../../../features/squad/components/week-nav.tsx';
import { formatWeekRange } from '../../../features/squad/utils/week-format.ts';
import { requireAccess } from '../../guards.ts';

/** The squads this coach runs (the list also holds squads they merely belong to). */
function coachedSquads(squads: SquadDetail[], coachId: string): SquadDetail[] {
  return squads.filter((s) => s.coach.id === coachId);
}

/** `?squad=` when it is one of theirs, else the first; `?week=` (any day) as its Monday, else this week's. */
function readSelection(search: URLSearchParams, squads: SquadDetail[], today: string) {
  const squad = squads.find((s) => s.id === search.get('squad')) ?? squads[0] ?? null;
  const monday = mondayOf(parseIsoDate(search.get('week')) ?? today);
  return { squad, monday };
}

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await requireAccess(queryClient, request, 'squads:manage');
    const squads = coachedSquads(await queryClient.ensureQueryData(squadsQueryOptions()), user.id);
    const profile = await queryClient.ensureQueryData(profileQueryOptions());
    const { squad, monday } = readSelection(new URL(request.url).searchParams, squads, todayIn(profile.time_zone));
    if (squad) await queryClient.ensureQueryData(squadOverviewQueryOptions(squad.id, monday));
    return null;
  };

export default function SquadRoute() {
  const me = useMe();
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const squads = coachedSquads(useSquads(), me?.id ?? '');
  const today = todayIn(useProfile().time_zone);
  const { squad, monday } = readSelection(search, squads, today);

  return (
    <>
      <PageHeader title="Squad">
        Your runners’ weeks side by side: planned against run, sessions run as planned, flags to look at, and which weeks you have
        reviewed.
      </PageHeader>
      {me && (
        <div className="mb-4">
          <NewNotesCard notAbout={me.id} weekHref={(runner, start) => paths.weekReview.getHref(runner, start)} />
        </div>
      )}
      {squad ? (
        <SquadWeek
          key={squad.id}
          squad={squad}
          squads={squads}
          monday={monday}
          today={today}
          onPick={(id) => navigate(paths.squad.getHref({ squad: id, week: monday }))}
        />
      ) : (
        <EmptyState
          title="No squad yet."
          next={<CreateSquadForm autoFocus onCreated={(created) => navigate(paths.squad.getHref({ squad: created.id }))} />}
        >
          <p>
            Name your squad, then invite runners by e-mail. Once they join, each runner’s week shows here: planned against run
            distance, sessions run as planned, and flags such as a sharp jump in weekly distance or a missed long run.
          </p>
        </EmptyState>
      )}
    </>
  );
}

type SquadWeekProps = {
  squad: SquadDetail;
  squads: SquadDetail[];
  monday: string;
  today: string;
  onPick: (squadId: string) => void;
};

function SquadWeek({ squad, squads, monday, today, onPick }: SquadWeekProps) {
  const navigate = useNavigate();
  const profile = useProfile();
  const overview = useSquadOverview(squad.id, monday);
  const digest = useSendDigest();
  const [inviting, setInviting] = useState(false);
  const [creating, setCreating] = useState(false);
  const isThisWeek = monday === mondayOf(today);
  const href = (week?: string) => paths.squad.getHref({ squad: squads.length > 1 ? squad.id : undefined, week });
  const receipt = digest.data && digest.variables?.squadId === squad.id && digest.variables.week === monday ? digest.data : null;
  const openInvitations = squad.invitations.filter((i) => i.status === 'open').length;

  return (
    <div className="flex flex-col gap-4">
      <Card>
        <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
          {squads.length > 1 ? (
            <SelectField label="Squad" value={squad.id} onChange={(e) => onPick(e.currentTarget.value)} className="min-w-56">
              {squads.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </SelectField>
          ) : (
            <h2 className="text-lg font-semibold">{squad.name}</h2>
          )}
          <Button variant="quiet" onClick={() => setCreating((c) => !c)} aria-expanded={creating}>
            {creating ? 'Cancel new squad' : 'New squad'}
          </Button>
        </div>
        {creating && (
          <div className="mb-4 rounded-md border border-line bg-paper p-3">
            <CreateSquadForm
              autoFocus
              onCreated={(created) => {
                setCreating(false);
                navigate(paths.squad.getHref({ squad: created.id, week: monday }));
              }}
            />
          </div>
        )}

        <div className="mb-3 flex flex-wrap items-center gap-3">
          <WeekNav
            title={formatWeekRange(monday)}
            previous={href(addDays(monday, -7))}
            next={href(addDays(monday, 7))}
            current={isThisWeek ? undefined : href()}
          />
          <div className="flex flex-wrap gap-2 lg:ml-auto">
            <Button
              variant="secondary"
              disabled={digest.isPending || overview.rows.length === 0}
              onClick={() => digest.mutate({ squadId: squad.id, week: monday })}
            >
              {digest.isPending ? 'Sending…' : 'Send weekly digest'}
            </Button>
            {overview.rows.length > 0 && <DownloadLink href={squadOverviewCsvHref(squad.id, monday)}>Download CSV</DownloadLink>}
            <Button onClick={() => setInviting(true)} aria-expanded={inviting}>
              Invite runners
            </Button>
          </div>
        </div>

        <div className="flex flex-col gap-3">
          {inviting && (
            <div className="rounded-md border border-line bg-paper p-3">
              <InviteForm squadId={squad.id} squadName={squad.name} onClose={() => setInviting(false)} />
            </div>
          )}
          {digest.isError && <FormAlert>{digest.error.message}</FormAlert>}
          {receipt && <DigestReceipt receipt={receipt} onDone={digest.reset} />}

          {overview.rows.length > 0 ? (
            <SquadOverviewTable
              rows={overview.rows}
              unit={profile.unit}
              caption={`${squad.name}, ${formatWeekRange(monday)}: one row per runner`}
            />
          ) : (
            <EmptyState
              title={`Nobody in ${squad.name} yet.`}
              next={
                !inviting && (
                  <Button onClick={() => setInviting(true)} aria-label="Invite runners by e-mail">
                    Invite runners
                  </Button>
                )
              }
            >
              <p>
                Invite runners by e-mail: each gets a link to join.{' '}
                {openInvitations > 0 &&
                  `${openInvitations} ${openInvitations === 1 ? 'invitation is' : 'invitations are'} waiting for an answer. `}
                Their weeks appear here as soon as they join.
              </p>
            </EmptyState>
          )}
          {overview.rows.length > 0 && <SquadOverviewHow />}
        </div>
      </Card>

      <Card title="Runners and invitations" description="Who is in the squad, and who has been asked to join.">
        <SquadPeople squad={squad} />
      </Card>

      <SquadFeesCard squadId={squad.id} squadName={squad.name} />
    </div>
  );
}
