import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useCallback, useEffect } from 'react';
import { useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { monthBounds, parseYearMonth, type YearMonth } from '../../../../shared/runs/calendar.ts';
import {
  describeRunListSorting,
  isDefaultRunListSorting,
  readRunListSorting,
  runListPagerLabels,
  type RunListSorting,
} from '../../../../shared/runs/list-sort.ts';
import type { RunPage } from '../../../../shared/runs/types.ts';
import { Card } from '../../../components/ui/card.tsx';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { HistoryImport } from '../../../features/imports/components/history-import.tsx';
import { NewNotesCard } from '../../../features/notes/components/new-notes-card.tsx';
import { profileQueryOptions, useProfile } from '../../../features/profile/api/get-profile.ts';
import { todayIn } from '../../../../shared/runs/local-time.ts';
import { MAX_RUNS_PER_PAGE, RUNS_PER_PAGE, runsQueryOptions, useRuns } from '../../../features/runs/api/get-runs.ts';
import { runKeys } from '../../../features/runs/api/run-keys.ts';
import { RunUpload } from '../../../features/runs/components/run-upload.tsx';
import { RunsCalendar } from '../../../features/runs/components/runs-calendar.tsx';
import { RunsTable } from '../../../features/runs/components/runs-table.tsx';
import { cursorBefore, rememberPage } from '../../../features/runs/utils/page-trail.ts';

/** This month in the profile's time zone (the calendar opens on it when there are no runs). */
function thisMonth(timeZone: string): YearMonth {
  return parseYearMonth(todayIn(timeZone).slice(0, 7))!;
}

const FIRST_PAGE = { page: 1, per_page: RUNS_PER_PAGE };

/** The page of the list from the address, so back and forward (and shared links) keep it. */
function readPage(search: URLSearchParams): number {
  return Math.max(1, Math.floor(Number(search.get('page'))) || 1);
}

/**
 * The calendar's month: the address's `?month=`, else the month of the newest run (so the last
 * runs are in view even early in a new month), else this month.
 */
function readMonth(search: URLSearchParams, newest: RunPage, timeZone: string): YearMonth {
  const latest = newest.runs[0];
  return parseYearMonth(search.get('month')) ?? (latest && parseYearMonth(latest.local_date.slice(0, 7))) ?? thisMonth(timeZone);
}

/**
 * The keyset cursor of a page past the first (`?page=N&after=…`): the runs after it are read without an offset, so
 * page 40 costs what page 1 does. A page number without a cursor (an older link, or "newer" from a shared link) is
 * read by its number (decision 46, server/features/runs/README.md).
 */
function readCursor(search: URLSearchParams, page: number): string | undefined {
  return page > 1 ? (search.get('after') ?? undefined) : undefined;
}

/** The list's order from the address (`?sort=&order=`), so a sorted list survives reloads and shared links. */
function readSorting(search: URLSearchParams): RunListSorting {
  return readRunListSorting(search.get('sort'), search.get('order'));
}

/**
 * The default order is left out of the filters, so page 1 shares its cache entry with `FIRST_PAGE`. With a cursor
 * the server is asked for its first page after the cursor (it refuses `after` with another page number).
 */
const listFilters = (page: number, sorting: RunListSorting, after: string | undefined) => ({
  ...(after ? { page: 1, after } : { page }),
  per_page: RUNS_PER_PAGE,
  ...(isDefaultRunListSorting(sorting) ? {} : sorting),
});

const monthFilters = (month: YearMonth) => ({ page: 1, per_page: MAX_RUNS_PER_PAGE, ...monthBounds(month) });

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    const page = readPage(search);
    const [newest] = await Promise.all([
      queryClient.ensureQueryData(runsQueryOptions(FIRST_PAGE)),
      queryClient.ensureQueryData(runsQueryOptions(listFilters(page, readSorting(search), readCursor(search, page)))),
    ]);
    await queryClient.ensureQueryData(
      runsQueryOptions(
        monthFilters(readMonth(search, newest, (await queryClient.ensureQueryData(profileQueryOptions())).time_zone)),
      ),
    );
    return null;
  };

export default function LogRoute() {
  const [search] = useSearchParams();
  const page = readPage(search);
  const profile = useProfile();
  const newest = useRuns(FIRST_PAGE);
  const sorting = readSorting(search);
  const after = readCursor(search, page);
  const list = useRuns(listFilters(page, sorting, after));
  // This page's start, for the "newer" link of the page after it (the server gives only the cursor forward).
  useEffect(() => {
    if (list.next_cursor) rememberPage(list.next_cursor, after);
  }, [list.next_cursor, after]);
  const month = readMonth(search, newest, profile.time_zone);
  const monthRuns = useRuns(monthFilters(month));
  const pages = Math.max(1, Math.ceil(list.total / list.per_page));
  const monthParam = search.get('month') ?? undefined;
  const importId = search.get('import');
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const refreshRuns = useCallback(() => void queryClient.invalidateQueries({ queryKey: runKeys.lists() }), [queryClient]);
  const showImport = (id: string) =>
    void navigate(paths.log.getHref({ page, after, month: monthParam, import: id, ...sorting }), { replace: true });
  // A new order starts again at its first page: page 3 of another order is a different set of runs.
  const sortRuns = (next: RunListSorting) =>
    void navigate(paths.log.getHref({ page: 1, month: monthParam, import: importId ?? undefined, ...next }));
  const pager = runListPagerLabels(sorting);
  const me = useMe();

  return (
    <>
      <PageHeader title="Log">Your runs, split by mile and by kilometre, and a month of them at a glance.</PageHeader>
      <div className="flex flex-col gap-4">
        {me && <NewNotesCard about={me.id} weekHref={(_runner, start) => paths.myWeek.getHref(start)} />}
        <Card title="Add runs" description="Each file is read on its own: splits per mile and per km appear within seconds.">
          <RunUpload unit={profile.unit} />
        </Card>
        <Card
          title="Whole history"
          description="Years of watch files at once: they are imported in the background, and the progress stays here if you reload."
        >
          <HistoryImport importId={importId} onStarted={showImport} onFinished={refreshRuns} />
        </Card>

        {list.total === 0 ? (
          <EmptyState title="No runs yet." next={<LinkButton to={paths.profile.getHref()}>Check your profile</LinkButton>}>
            <p>
              Export the activity from your watch or its app as GPX or TCX and drop the file above. Each run then shows its splits
              per mile and per kilometre, moving time against clock time, and heart rate and elevation for every split.
            </p>
            <p>Set your heart rates and time zone first: zones and dates are read from them.</p>
          </EmptyState>
        ) : (
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] lg:items-start">
            <Card title="Month">
              <RunsCalendar
                month={month}
                runs={monthRuns.runs}
                unit={profile.unit}
                today={todayIn(profile.time_zone)}
                page={page}
                after={after}
                sorting={sorting}
              />
            </Card>
            <Card
              title="Runs"
              description={`${list.total} in all, ${describeRunListSorting(sorting)}. The headers sort all your runs, not just this page.`}
            >
              <RunsTable runs={list.runs} unit={profile.unit} sorting={sorting} onSortingChange={sortRuns} />
              {pages > 1 && (
                <nav aria-label="Pages of runs" className="mt-3 flex items-center justify-between gap-2 text-sm">
                  {page > 1 ? (
                    <LinkButton
                      to={paths.log.getHref({
                        page: page - 1,
                        after: cursorBefore(after),
                        month: monthParam,
                        import: importId ?? undefined,
                        ...sorting,
                      })}
                    >
                      ◀ {pager.back}
                    </LinkButton>
                  ) : (
                    <span />
                  )}
                  <span className="text-ink-muted tabular-nums">
                    Page {page} of {pages}
                  </span>
                  {list.next_cursor ? (
                    <LinkButton
                      to={paths.log.getHref({
                        page: page + 1,
                        after: list.next_cursor,
                        month: monthParam,
                        import: importId ?? undefined,
                        ...sorting,
                      })}
                    >
                      {pager.forward} ▶
                    </LinkButton>
                  ) : (
                    <span />
                  )}
                </nav>
              )}
            </Card>
          </div>
        )}
      </div>
    </>
  );
}
