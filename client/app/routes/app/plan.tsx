import { useQueries, useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { SessionVerdict } from '../../../../shared/plans/plan-check.ts';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { addDays, mondayOf, parseIsoDate } from '../../../../shared/plans/weeks.ts';
import { formatYearMonth, monthBounds, parseYearMonth, shiftMonth, type YearMonth } from '../../../../shared/runs/calendar.ts';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';
import { goalRaceQueryOptions } from '../../../features/goals/api/get-goal-race.ts';
import { planCheckKeys } from '../../../features/plan-check/api/plan-check-keys.ts';
import { planCheckQueryOptions } from '../../../features/plan-check/api/get-plan-check.ts';
import { useCopyWeek } from '../../../features/plans/api/copy-week.ts';
import { plansQueryOptions, usePlans } from '../../../features/plans/api/get-plans.ts';
import { GoalRaceLine } from '../../../features/plans/components/goal-race-line.tsx';
import { PlanMonth } from '../../../features/plans/components/plan-month.tsx';
import { PlanWeek, formatDay } from '../../../features/plans/components/plan-week.tsx';
import { SessionEditor } from '../../../features/plans/components/session-editor.tsx';
import { profileQueryOptions, useProfile } from '../../../features/profile/api/get-profile.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { isApiError } from '../../../lib/api-client.ts';
import { useDayMarks } from '../../../features/plans/api/day-marks.ts';
import { runnerSummaryQueryOptions, useRunnerSummary } from '../../../features/plans/api/runner-summary.ts';
import { useUndoBatch } from '../../../features/plans/api/undo-batch.ts';
import { useUpdatePlan } from '../../../features/plans/api/update-plan.ts';
import { DayMarkForm } from '../../../features/plans/components/day-mark-form.tsx';
import { LibraryCard } from '../../../features/plans/components/library-card.tsx';
import { ToleranceControl } from '../../../features/plans/components/tolerance-control.tsx';
import { squadsQueryOptions } from '../../../features/squad/api/get-squads.ts';
import { requireAccess } from '../../guards.ts';
import { todayIn } from '../../../../shared/runs/local-time.ts';
import { MAX_RUNS_PER_PAGE, runsQueryOptions, useRuns } from '../../../features/runs/api/get-runs.ts';

type PlanView =
  { view: 'week'; monday: string; from: string; to: string } | { view: 'month'; month: YearMonth; from: string; to: string };

/** What the address asks for: `?week=` (any day of it) by default, `?view=month&month=YYYY-MM` for a month. */
function readView(search: URLSearchParams, today: string): PlanView {
  if (search.get('view') === 'month') {
    const month = parseYearMonth(search.get('month')) ?? parseYearMonth(today.slice(0, 7))!;
    return { view: 'month', month, ...monthBounds(month) };
  }
  const monday = mondayOf(parseIsoDate(search.get('week')) ?? today);
  return { view: 'week', monday, from: monday, to: addDays(monday, 6) };
}

const runFilters = ({ from, to }: { from: string; to: string }, runnerId: string | undefined) => ({
  page: 1,
  per_page: MAX_RUNS_PER_PAGE,
  from,
  to,
  ...(runnerId ? { runner_id: runnerId } : {}),
});

const planFilters = ({ from, to }: { from: string; to: string }, runnerId: string | undefined) => ({
  from,
  to,
  ...(runnerId ? { runner_id: runnerId } : {}),
});

/** `/plan` is the signed-in person's own plan; `/squad/:runnerId/plan` a squad runner's, opened by their coach. */
export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    const runnerId = params.runnerId;
    if (runnerId) await requireAccess(queryClient, request, 'squads:manage');
    const [profile, runner] = await Promise.all([
      queryClient.ensureQueryData(profileQueryOptions()),
      runnerId ? queryClient.ensureQueryData(runnerSummaryQueryOptions(runnerId)) : null,
    ]);
    // The week shown first is the one holding the plan owner's today (the runner's, on a coach's view).
    const range = readView(new URL(request.url).searchParams, todayIn(runner?.time_zone ?? profile.time_zone));
    await Promise.all([
      queryClient.ensureQueryData(goalRaceQueryOptions(runnerId)),
      queryClient.ensureQueryData(plansQueryOptions(planFilters(range, runnerId))),
      queryClient.ensureQueryData(runsQueryOptions(runFilters(range, runnerId))),
    ]);
    return null;
  };

const MONTH_TITLE = new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' });

function weekTitle(monday: string): string {
  const sunday = addDays(monday, 6);
  return `${formatDay(monday)} – ${formatDay(sunday)} ${sunday.slice(0, 4)}`;
}

type EditorState = { plan: Plan | null; date: string; key: number };

/** The session editor named in the address (`?edit=<plan id>`, `?new=<date>`): a reload reopens it, with its draft. */
function editorFromSearch(search: URLSearchParams, plans: readonly Plan[]): EditorState | null {
  const edit = search.get('edit');
  const plan = edit ? plans.find((p) => p.id === edit) : undefined;
  if (plan) return { plan, date: plan.date, key: 1 };
  const date = parseIsoDate(search.get('new'));
  return date ? { plan: null, date, key: 1 } : null;
}

type Status = { text: string; link?: { to: string; label: string }; range: string; undo?: () => void };

export default function PlanRoute() {
  const { runnerId } = useParams();
  return runnerId ? <RunnerPlan runnerId={runnerId} /> : <PlanPage runner={null} />;
}

function RunnerPlan({ runnerId }: { runnerId: string }) {
  const runner = useRunnerSummary(runnerId);
  return <PlanPage key={runnerId} runner={runner} />;
}

function PlanPage({ runner }: { runner: { id: string; name: string; pace_tolerance: number; time_zone: string } | null }) {
  const runnerId = runner?.id;
  const [search, setSearch] = useSearchParams();
  const profile = useProfile();
  // One clock for the page (issue 17). "Today" is the plan owner's: on a coach's view of a runner's plan it is
  // the runner's day (the coach may be hours away), as in the week review; "changed Tue" in the bylines is
  // read in the reader's own time zone.
  const now = new Date();
  const today = todayIn(runner?.time_zone ?? profile.time_zone, now.getTime());
  const range = readView(search, today);
  const me = useMe();
  const isCoach = me?.role === 'coach';
  const squads = useQuery({ ...squadsQueryOptions(), enabled: isCoach });
  const squadRunners = [
    ...new Map((squads.data ?? []).flatMap((sq) => sq.members).map((m) => [m.id, { id: m.id, name: m.name }])).values(),
  ];
  const goalRace = useSuspenseQuery(goalRaceQueryOptions(runnerId)).data;
  const plans = usePlans(planFilters(range, runnerId));
  const dayMarks = useDayMarks(planFilters(range, runnerId)).data ?? [];
  const { runs } = useRuns(runFilters(range, runnerId));
  const planHref = (search?: { view?: 'week' | 'month'; week?: string; month?: string }) =>
    runnerId ? paths.runnerPlan.getHref(runnerId, search) : paths.plan.getHref(search);
  const timeZone = profile.time_zone;
  const queryClient = useQueryClient();
  // One plan check per run, in the week view only (a month would be dozens of requests). Not
  // suspended: the week shows at once and the verdicts follow.
  const weekRunIds = range.view === 'week' ? runs.map((r) => r.id) : [];
  const checks = useQueries({
    queries: weekRunIds.map((id) => planCheckQueryOptions(id)),
    combine: (results) => {
      const byRun = new Map<string, SessionVerdict>();
      results.forEach((r, i) => {
        if (r.data) byRun.set(weekRunIds[i] as string, r.data.session_verdict);
      });
      return byRun;
    },
  });
  // Plan checks (and the run page's list of plans to link) follow the plans: refresh them after a write.
  const refreshChecks = () => queryClient.invalidateQueries({ queryKey: planCheckKeys.all });
  const copyWeek = useCopyWeek();
  const undoBatch = useUndoBatch();
  const move = useUpdatePlan();
  const [editor, setEditor] = useState<EditorState | null>(() => editorFromSearch(search, plans));
  /** Names the open editor in the address (replacing the entry, so Back still leaves the page). */
  const showEditor = (next: { plan: Plan | null; date: string } | null) => {
    setSearch(
      (current) => {
        const params = new URLSearchParams(current);
        params.delete('edit');
        params.delete('new');
        if (next) params.set(next.plan ? 'edit' : 'new', next.plan ? next.plan.id : next.date);
        return params;
      },
      { replace: true, preventScrollReset: true },
    );
    setEditor((e) => (next ? { ...next, key: (e?.key ?? 0) + 1 } : null));
  };
  const [status, setStatus] = useState<Status | null>(null);
  const [copyAsk, setCopyAsk] = useState<string | null>(null);
  const [markDate, setMarkDate] = useState<string | null>(null);

  /** Shows what a batch did, with an undo that lasts while the page is open. */
  const batchStatus = (text: string, batchId: string, link?: Status['link']): Status => ({
    range: range.from,
    text,
    link,
    undo: () =>
      undoBatch.mutate(batchId, {
        onSuccess: () => {
          void refreshChecks();
          setStatus({ range: range.from, text: 'Undone: the sessions are as they were.' });
        },
      }),
  });

  function moveSession(plan: Plan, date: string) {
    const from = plan.date;
    move.mutate(
      { id: plan.id, date },
      {
        onSuccess: () => {
          void refreshChecks();
          setStatus({
            range: range.from,
            text: `Moved ${plan.title || 'the session'} from ${formatDay(from)} to ${formatDay(date)}.`,
            undo: () =>
              move.mutate(
                { id: plan.id, date: from },
                { onSuccess: () => setStatus({ range: range.from, text: 'Moved back.' }) },
              ),
          });
        },
      },
    );
  }

  const open = (plan: Plan | null, date: string) => {
    setStatus(null);
    showEditor({ plan, date });
  };

  function onDone(plan: Plan | null, message: string) {
    showEditor(null);
    void refreshChecks();
    const outside = plan && (plan.date < range.from || plan.date > range.to);
    setStatus({
      range: range.from,
      text: message,
      link: outside ? { to: planHref({ week: mondayOf(plan.date) }), label: `Show ${formatDay(plan.date)}` } : undefined,
    });
  }

  const title = range.view === 'week' ? weekTitle(range.monday) : MONTH_TITLE.format(new Date(`${range.from}T00:00:00Z`));
  const previous =
    range.view === 'week'
      ? planHref({ week: addDays(range.monday, -7) })
      : planHref({ view: 'month', month: formatYearMonth(shiftMonth(range.month, -1)) });
  const next =
    range.view === 'week'
      ? planHref({ week: addDays(range.monday, 7) })
      : planHref({ view: 'month', month: formatYearMonth(shiftMonth(range.month, 1)) });
  const nav =
    'inline-flex size-11 sm:size-9 items-center justify-center rounded-md border border-line bg-card text-teal hover:border-teal';
  const tab = (active: boolean) =>
    cn(
      'inline-flex min-h-11 sm:min-h-9 items-center px-3 text-sm font-semibold',
      active ? 'bg-teal text-white' : 'bg-card text-teal hover:bg-teal-wash',
    );

  function copyToNextWeek(mode?: 'replace' | 'add') {
    if (range.view !== 'week') return;
    const to = addDays(range.monday, 7);
    setCopyAsk(null);
    copyWeek.mutate(
      { from_start: range.monday, to_start: to, ...(runnerId ? { runner_id: runnerId } : {}), ...(mode ? { mode } : {}) },
      {
        onSuccess: (result) => {
          void refreshChecks();
          const n = result.plans.length;
          const replaced =
            result.replaced > 0 ? `, replacing ${result.replaced} ${result.replaced === 1 ? 'session' : 'sessions'}` : '';
          setStatus(
            batchStatus(
              `Copied ${n} ${n === 1 ? 'session' : 'sessions'} to the week of ${formatLocalDate(to)}${replaced}.`,
              result.batch_id,
              {
                to: planHref({ week: to }),
                label: 'Show next week',
              },
            ),
          );
        },
        onError: (err) => {
          if (isApiError(err) && err.code === 'week-has-sessions') setCopyAsk(err.message);
        },
      },
    );
  }

  return (
    <>
      {runner ? (
        <PageHeader title={`${runner.name}’s plan`}>
          You are writing for {runner.name.split(' ')[0]}
          {goalRace ? ` · their goal race: ${goalRace.name}` : ' · no goal race set yet'}.{' '}
          <Link
            to={paths.weekReview.getHref(runner.id, range.view === 'week' ? range.monday : range.from)}
            className="inline-flex tap-target items-center font-semibold text-teal underline-offset-2 hover:underline"
          >
            Week review
          </Link>
        </PageHeader>
      ) : (
        <PageHeader title="Plan">
          Your goal race and the session plans that lead to it, with what you ran beside them.{' '}
          <Link
            to={paths.myWeek.getHref(range.view === 'week' ? range.monday : undefined)}
            className="inline-flex tap-target items-center font-semibold text-teal underline-offset-2 hover:underline"
          >
            My week: totals, load, flags and notes
          </Link>
        </PageHeader>
      )}
      <div className="flex flex-col gap-4">
        <Card title="Goal race">
          <GoalRaceLine goalRace={goalRace} unit={profile.unit} today={today} />
          {goalRace && !runner && (
            <Link
              to={paths.goalFuel.getHref()}
              className="mt-1 inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
            >
              Race fuel plan
            </Link>
          )}
        </Card>

        {runner && (
          <Card title="Plan check">
            <ToleranceControl runnerId={runner.id} runnerName={runner.name} tolerance={runner.pace_tolerance} />
          </Card>
        )}

        {editor && (
          <SessionEditor
            key={editor.key}
            plan={editor.plan}
            date={editor.date}
            userId={me?.id ?? ''}
            runnerId={runnerId}
            ownerZone={runner?.time_zone ?? profile.time_zone}
            onClose={() => showEditor(null)}
            onDone={onDone}
          />
        )}
        {markDate && (
          <DayMarkForm
            key={markDate}
            date={markDate}
            mark={dayMarks.find((m) => m.date === markDate) ?? null}
            runnerId={runnerId}
            onClose={(message) => {
              setMarkDate(null);
              if (message) setStatus({ range: range.from, text: message });
            }}
          />
        )}
        {editor?.plan && (
          <Link
            to={paths.planFuel.getHref(editor.plan.id)}
            className="-mt-2 inline-flex tap-target items-center self-start text-sm font-semibold text-teal underline-offset-2 hover:underline"
          >
            Fuel plan for {editor.plan.title || 'this session'}
          </Link>
        )}

        {copyAsk && (
          <div role="alertdialog" aria-label="The next week has sessions" className="rounded-md border border-tartan bg-card p-4">
            <p className="mb-3 text-sm">{copyAsk}</p>
            <div className="flex flex-wrap gap-2">
              <Button onClick={() => copyToNextWeek('replace')}>Replace them</Button>
              <Button variant="secondary" onClick={() => copyToNextWeek('add')}>
                Add beside them
              </Button>
              <Button variant="quiet" onClick={() => setCopyAsk(null)}>
                Cancel
              </Button>
            </div>
          </div>
        )}
        {status?.range === range.from && (
          <FormAlert tone="success">
            {status.text}{' '}
            {status.link && (
              <Link to={status.link.to} className="font-semibold underline underline-offset-2" onClick={() => setStatus(null)}>
                {status.link.label}
              </Link>
            )}
            {status.undo && (
              <>
                {' '}
                <Button
                  variant="quiet"
                  className="min-h-0 px-0 py-0 font-semibold underline"
                  onClick={status.undo}
                  disabled={undoBatch.isPending}
                >
                  Undo
                </Button>
              </>
            )}
          </FormAlert>
        )}
        {copyWeek.error && !(isApiError(copyWeek.error) && copyWeek.error.code === 'week-has-sessions') && (
          <FormAlert>{copyWeek.error.message}</FormAlert>
        )}
        {(move.error ?? undoBatch.error) && <FormAlert>{(move.error ?? undoBatch.error)!.message}</FormAlert>}

        <Card>
          <div className="mb-3 flex flex-wrap items-center gap-2">
            <nav aria-label="Calendar view" className="flex overflow-hidden rounded-md border border-line">
              <Link
                to={planHref({ week: range.view === 'week' ? range.monday : mondayOf(range.from) })}
                aria-current={range.view === 'week' ? 'page' : undefined}
                className={tab(range.view === 'week')}
              >
                Week
              </Link>
              <Link
                to={planHref({ view: 'month', month: range.from.slice(0, 7) })}
                aria-current={range.view === 'month' ? 'page' : undefined}
                className={cn(tab(range.view === 'month'), 'border-l border-line')}
              >
                Month
              </Link>
            </nav>
            <div className="flex items-center gap-1">
              <Link to={previous} className={nav} aria-label={range.view === 'week' ? 'Previous week' : 'Previous month'}>
                ◀
              </Link>
              <h2 className="min-w-44 px-1 text-center font-semibold tabular-nums" aria-live="polite">
                {title}
              </h2>
              <Link to={next} className={nav} aria-label={range.view === 'week' ? 'Next week' : 'Next month'}>
                ▶
              </Link>
            </div>
            {(range.view === 'week' ? today < range.from || today > range.to : range.from.slice(0, 7) !== today.slice(0, 7)) && (
              <Link
                to={range.view === 'week' ? planHref() : planHref({ view: 'month' })}
                className="inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
              >
                {range.view === 'week' ? 'This week' : 'This month'}
              </Link>
            )}
            <div className="flex flex-wrap gap-2 sm:ml-auto">
              {range.view === 'week' && (
                <Button
                  variant="secondary"
                  onClick={() => copyToNextWeek()}
                  disabled={plans.length === 0 || copyWeek.isPending}
                  title={plans.length === 0 ? 'This week has no sessions to copy.' : undefined}
                >
                  {copyWeek.isPending ? 'Copying…' : 'Copy this week to next week'}
                </Button>
              )}
              <Button
                onClick={() => open(null, range.view === 'week' && (today < range.from || today > range.to) ? range.from : today)}
              >
                New session
              </Button>
            </div>
          </div>
          {range.view === 'week' ? (
            <PlanWeek
              monday={range.monday}
              plans={plans}
              runs={runs}
              unit={profile.unit}
              today={today}
              checks={checks}
              onEdit={(plan) => open(plan, plan.date)}
              onNew={(date) => open(null, date)}
              onMove={moveSession}
              onMarkDay={(date) => {
                setStatus(null);
                setMarkDate(date);
              }}
              dayMarks={dayMarks}
              now={now}
              timeZone={timeZone}
              movingId={move.isPending ? (move.variables?.id ?? null) : null}
            />
          ) : (
            <PlanMonth
              month={range.month}
              plans={plans}
              runs={runs}
              unit={profile.unit}
              today={today}
              title={title}
              weekHref={(monday) => planHref({ week: monday })}
            />
          )}
        </Card>

        <LibraryCard
          forRunner={runner ?? { id: me?.id ?? '', name: me?.name ?? 'You' }}
          squadRunners={isCoach ? squadRunners : []}
          defaultDate={range.view === 'week' && (today < range.from || today > range.to) ? range.from : today}
          onApplied={(message, batchId, date) => {
            void refreshChecks();
            setStatus(
              batchStatus(
                message,
                batchId,
                date < range.from || date > range.to
                  ? { to: planHref({ week: mondayOf(date) }), label: `Show ${formatDay(date)}` }
                  : undefined,
              ),
            );
          }}
        />
      </div>
    </>
  );
}
