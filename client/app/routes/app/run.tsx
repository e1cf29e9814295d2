import type { QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { RunTrack } from '../../../../shared/runs/types.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { CheckinCard } from '../../../features/fuel/components/checkin-card.tsx';
import { FuelTakenCard } from '../../../features/fuel/components/fuel-taken-card.tsx';
import { planCheckQueryOptions } from '../../../features/plan-check/api/get-plan-check.ts';
import { PlanCheckCard } from '../../../features/plan-check/components/plan-check-card.tsx';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { useUnitChoice } from '../../../features/profile/api/use-unit-choice.ts';
import { runNotesQueryOptions } from '../../../features/run-notes/api/get-run-notes.ts';
import { RunNotesCard } from '../../../features/run-notes/components/run-notes-card.tsx';
import { runQueryOptions, useRun } from '../../../features/runs/api/get-run.ts';
import { runTrackQueryOptions, useRunTrack } from '../../../features/runs/api/get-run-track.ts';
import { EnergyEstimate, HeartRateZones } from '../../../features/runs/components/effort-figures.tsx';
import { FastestSections } from '../../../features/runs/components/fastest-sections.tsx';
import { HowComputed } from '../../../features/runs/components/how-computed.tsx';
import { LapsTable } from '../../../features/runs/components/laps-table.tsx';
import { RouteOutline } from '../../../features/runs/components/route-outline.tsx';
import { RunChartsPanel } from '../../../features/runs/components/run-charts-panel.tsx';
import { RunDownloads } from '../../../features/runs/components/run-downloads.tsx';
import { ActivityKindLine } from '../../../features/runs/components/activity-kind.tsx';
import { RunOwnerActions } from '../../../features/runs/components/run-owner-actions.tsx';
import { RunSummary } from '../../../features/runs/components/run-summary.tsx';
import { SplitTable } from '../../../features/runs/components/split-table.tsx';
import { UnitToggle } from '../../../features/runs/components/unit-toggle.tsx';
import { describeDistanceMeasure } from '../../../../shared/runs/display.ts';

const UNIT_WORDS: Record<Unit, string> = { mi: 'mile', km: 'kilometre' };

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = params.id ?? '';
    // The series is only for charts and the outline: start it, but show the splits without waiting.
    void queryClient.prefetchQuery(runTrackQueryOptions(id));
    // The plan check reads the series too; it follows the splits in its own card.
    void queryClient.prefetchQuery(planCheckQueryOptions(id));
    void queryClient.prefetchQuery(runNotesQueryOptions(id));
    await queryClient.ensureQueryData(runQueryOptions(id));
    return null;
  };

export default function RunRoute() {
  const id = useParams().id ?? '';
  const run = useRun(id);
  const me = useMe();
  const profile = useProfile();
  // One unit setting (issue 17): this card's toggle saves it to the profile like the top bar's switch, so the
  // whole app moves together and it is remembered; the chosen unit shows while the save is in flight.
  const { unit, choose: chooseUnit } = useUnitChoice();
  const isOwner = me?.id === run.owner_id;
  const { details } = run;

  return (
    <>
      <PageHeader title={run.name} />
      <div className="-mt-3 mb-5 flex flex-col gap-4">
        <RunSummary summary={run.summary} unit={unit} />
        <ActivityKindLine runId={run.id} kind={run.kind} isOwner={isOwner} />
        {run.details.distance && (
          <p className="text-sm text-ink-muted" data-testid="distance-measure">
            Distance: {describeDistanceMeasure(run.details.distance, unit)}
          </p>
        )}
        <div className="flex flex-wrap items-center justify-between gap-3">
          <RunDownloads runId={run.id} />
          {isOwner && <RunOwnerActions key={run.name} runId={run.id} name={run.name} />}
        </div>
      </div>

      <div className="mb-4">
        <PlanCheckCard runId={run.id} localDate={run.summary.local_date} unit={unit} isOwner={isOwner} />
      </div>

      <Card
        title="Splits"
        description={`Per ${UNIT_WORDS[unit]}; pace from moving time. Sort by any column.`}
        actions={<UnitToggle label="Split unit" value={unit} onChange={chooseUnit} />}
      >
        {run.splits[unit].length > 0 ? (
          <SplitTable splits={run.splits[unit]} unit={unit} unitLabel={UNIT_WORDS[unit]} />
        ) : (
          <p className="text-sm text-ink-muted">This run has no distance, so it has no splits.</p>
        )}
      </Card>

      <div className="mt-4 grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,7fr)_minmax(0,5fr)] lg:items-start">
        <div className="flex min-w-0 flex-col gap-4">
          <TrackCard runId={run.id} title="Over distance" description="Pace, heart rate and elevation on one distance axis.">
            {(track) => <RunChartsPanel track={track} unit={unit} />}
          </TrackCard>
          {run.laps.length > 0 && (
            <Card title="Device laps" description="As the watch recorded them, beside the computed splits.">
              <LapsTable laps={run.laps} unit={unit} />
            </Card>
          )}
        </div>
        <div className="flex min-w-0 flex-col gap-4">
          <Card title="Fastest sections" description="The quickest stretch of each distance inside this run, by moving time.">
            <FastestSections sections={run.fastest_sections} unit={unit} />
          </Card>
          <TrackCard runId={run.id} title="Route outline">
            {(track) => <RouteOutline track={track} />}
          </TrackCard>
          {details.hr_zones && (
            <Card title="Heart-rate zones">
              <HeartRateZones zones={details.hr_zones} />
            </Card>
          )}
          {details.energy && (
            <Card title="Energy">
              <EnergyEstimate energy={details.energy} />
            </Card>
          )}
        </div>
      </div>

      <div className="mt-4">
        <Card title="How this is computed">
          <HowComputed run={run} />
        </Card>
      </div>

      <div className="mt-4">
        <RunNotesCard runId={run.id} myId={me?.id} ownerId={run.owner_id} ownerZone={run.owner_time_zone} />
      </div>

      <div className="mt-4 grid grid-cols-1 gap-4 lg:grid-cols-2 lg:items-start">
        <FuelTakenCard runId={run.id} userId={profile.id} localDate={run.summary.local_date} isOwner={isOwner} unit={unit} />
        <CheckinCard runId={run.id} userId={profile.id} isOwner={isOwner} />
      </div>
    </>
  );
}

type TrackCardProps = {
  runId: string;
  title: string;
  description?: string;
  children: (track: RunTrack) => ReactNode;
};

/** A card drawn from the recorded points, which arrive after the splits. */
function TrackCard({ runId, title, description, children }: TrackCardProps) {
  const track = useRunTrack(runId);
  return (
    <Card title={title} description={description}>
      {track.data ? (
        children(track.data)
      ) : track.isError ? (
        <p role="alert" className="text-sm text-tartan">
          The recorded points could not be loaded: {track.error.message}
        </p>
      ) : (
        <p role="status" className="py-8 text-center text-sm text-ink-muted">
          Loading the recorded points…
        </p>
      )}
    </Card>
  );
}
