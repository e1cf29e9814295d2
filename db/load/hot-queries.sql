-- The hot queries of the run list, calendar, week review, squad overview and run page, as Knex
-- sends them, under EXPLAIN (ANALYZE, BUFFERS). For the database `npm run seed:load` fills:
--   psql -h 127.0.0.1 -p 54329 -U postgres -d pacewright_load -f db/load/hot-queries.sql
-- Runner 017 of squad 1, a week in the middle of the history, that week's longest run.
\set QUIET on
\pset pager off
select id as runner from users where email = 'runner017@tamsel-load.test' \gset
select s.id as squad, s.coach_id as coach from squads s where s.name = 'Lake Tamsel Load Squad 1' \gset
select (date_trunc('week', min(local_date) + (max(local_date) - min(local_date)) / 2))::date as week_start
  from runs where user_id = :'runner' \gset
select (:'week_start'::date + 6) as week_end, (:'week_start'::date - 77) as history_from,
  to_char(:'week_start'::date, 'YYYY-MM-01') as month_from,
  (date_trunc('month', :'week_start'::date) + interval '1 month - 1 day')::date as month_to \gset
select id as run, source_file_id as source_file from runs
  where user_id = :'runner' and local_date between :'week_start' and :'week_end' order by distance_m desc limit 1 \gset
\echo runner :runner, week :week_start to :week_end, month :month_from to :month_to, run :run
\set QUIET off

\echo '== runs list: total'
explain (analyze, buffers) select count(*) as "count" from "runs" where "user_id" = :'runner';
\echo '== runs list: page 1'
explain (analyze, buffers) select * from "runs" where "user_id" = :'runner' order by "started_at" desc limit 50;
\echo '== runs list: page 15'
explain (analyze, buffers) select * from "runs" where "user_id" = :'runner' order by "started_at" desc limit 50 offset 700;
\echo '== calendar: month total'
explain (analyze, buffers) select count(*) as "count" from "runs"
  where "user_id" = :'runner' and "local_date" >= :'month_from' and "local_date" <= :'month_to';
\echo '== calendar: month of runs'
explain (analyze, buffers) select * from "runs"
  where "user_id" = :'runner' and "local_date" >= :'month_from' and "local_date" <= :'month_to'
  order by "started_at" desc limit 200;
\echo '== week review: runs of the 12-week trend'
explain (analyze, buffers) select * from "runs"
  where "user_id" = :'runner' and "local_date" >= :'history_from' and "local_date" <= :'week_end' order by "started_at" asc;
\echo '== week review: last upload'
explain (analyze, buffers) select max("created_at") as "last" from "runs" where "user_id" = :'runner' limit 1;
\echo '== week review: plans of the week'
explain (analyze, buffers) select * from "session_plans"
  where "runner_id" = :'runner' and "date" >= :'week_start' and "date" <= :'week_end' order by "date" asc, "created_at" asc;
\echo '== week review: week notes'
explain (analyze, buffers) select "week_notes"."id", "week_notes"."text", "week_notes"."created_at", "week_notes"."author_id",
  "users"."name" as "author_name", "users"."role" as "author_role"
  from "week_notes" inner join "users" on "users"."id" = "week_notes"."author_id"
  where "week_notes"."runner_id" = :'runner' and "week_notes"."week_start" = :'week_start' order by "week_notes"."created_at" asc;
\echo '== week review: reviews'
explain (analyze, buffers) select "week_reviews"."coach_id", "users"."name" as "coach_name", "week_reviews"."reviewed_at"
  from "week_reviews" inner join "users" on "users"."id" = "week_reviews"."coach_id"
  where "week_reviews"."runner_id" = :'runner' and "week_reviews"."week_start" = :'week_start';
\echo '== week review, per run: plan of the day'
explain (analyze, buffers) select * from "session_plans" where "runner_id" = :'runner' and "date" = :'week_start'
  order by "created_at" asc limit 1;
\echo '== week review, per run: chosen plan link'
explain (analyze, buffers) select * from "run_plan_links" where "run_id" = :'run' limit 1;
\echo '== week review, per run: track'
explain (analyze, buffers) select * from "run_tracks" where "run_id" = :'run' limit 1;
\echo '== squad overview: members'
explain (analyze, buffers) select "users"."id", "users"."name", "users"."email", "squad_members"."joined_at"
  from "squad_members" inner join "users" on "users"."id" = "squad_members"."runner_id"
  where "squad_members"."squad_id" = :'squad' order by "users"."name" asc;
\echo '== squad overview, per runner: coaches of the runner'
explain (analyze, buffers) select distinct "squads"."coach_id" from "squad_members"
  inner join "squads" on "squads"."id" = "squad_members"."squad_id" where "squad_members"."runner_id" = :'runner';
\echo '== squad overview, per runner: race results'
explain (analyze, buffers) select * from "race_results" where "user_id" = :'runner' order by "date" desc;
\echo '== run page: km splits'
explain (analyze, buffers) select * from "run_splits" where "run_id" = :'run' and "unit" = 'km' order by "split_index" asc;
\echo '== run page: all splits'
explain (analyze, buffers) select * from "run_splits" where "run_id" = :'run' order by "unit" asc, "split_index" asc;
\echo '== import: duplicate file, first run of a source file'
explain (analyze, buffers) select * from "runs" where "source_file_id" = :'source_file' order by "activity_index" asc limit 1;
\echo '== run delete: does another run use the file'
explain (analyze, buffers) select * from "runs" where "source_file_id" = :'source_file' limit 1;

-- Since 20261202001000_plan_check_results: the week review and the squad overview read all their
-- runners at once (server/features/weeks/weeks.repository.ts) and stored plan-check results.
\set QUIET on
select array_agg(runner_id)::text as members from squad_members where squad_id = :'squad' \gset
select array_agg(id)::text as week_runs from runs
  where user_id = any(:'members'::uuid[]) and local_date between :'week_start' and :'week_end' \gset
\set QUIET off
\echo '== squad overview: loads of every runner over the 12-week trend'
explain (analyze, buffers) select "user_id", "local_date", "distance_m", (details->'trimp'->>'trimp')::float8 as trimp
  from "runs" where "user_id" = any(:'members'::uuid[]) and "local_date" >= :'history_from' and "local_date" <= :'week_end'
  order by "started_at" asc;
\echo '== squad overview: runs of the week as list items'
explain (analyze, buffers) select "id", "name", "started_at", "local_date", "local_time", "time_zone", "distance_m",
  "elapsed_s", "moving_s", "ascent_m", "avg_hr", "user_id", (details->'trimp'->>'trimp')::float8 as trimp
  from "runs" where "user_id" = any(:'members'::uuid[]) and "local_date" >= :'week_start' and "local_date" <= :'week_end'
  order by "started_at" asc;
\echo '== squad overview: last upload of every runner'
explain (analyze, buffers) select r.id as user_id, (select max(created_at) from runs where runs.user_id = r.id) as last
  from unnest(:'members'::uuid[]) as r(id);
\echo '== squad overview: plans of the week'
explain (analyze, buffers) select * from "session_plans"
  where "runner_id" = any(:'members'::uuid[]) and "date" >= :'week_start' and "date" <= :'week_end'
  order by "date" asc, "created_at" asc, "id" asc;
\echo '== squad overview: reviews of the week'
explain (analyze, buffers) select "week_reviews"."runner_id", "week_reviews"."week_start", "week_reviews"."coach_id",
  "users"."name" as "coach_name", "week_reviews"."reviewed_at"
  from "week_reviews" inner join "users" on "users"."id" = "week_reviews"."coach_id"
  where "week_reviews"."runner_id" = any(:'members'::uuid[]) and "week_reviews"."week_start" in (:'week_start')
  order by "week_reviews"."reviewed_at" asc;
\echo '== plan checks of the week: chosen plans, plans of the days, stored results'
explain (analyze, buffers) select * from "run_plan_links" where "run_id" = any(:'week_runs'::uuid[]);
explain (analyze, buffers) select * from "session_plans"
  where ("runner_id" = any(:'members'::uuid[]) and "date" between :'week_start' and :'week_end')
  order by "date" asc, "created_at" asc, "id" asc;
explain (analyze, buffers) select * from "plan_check_results" where "run_id" = any(:'week_runs'::uuid[]);
\echo '== runs list: page 1 with its total in one query'
explain (analyze, buffers) select "id", "name", "started_at", "local_date", "local_time", "time_zone", "distance_m",
  "elapsed_s", "moving_s", "ascent_m", "avg_hr", (select count(*) from "runs" where "user_id" = :'runner') as "total"
  from "runs" where "user_id" = :'runner' order by "started_at" desc limit 50;
\echo '== run page: the run with its splits, laps and fastest sections in one query'
explain (analyze, buffers) select runs.*,
  (select coalesce(json_agg(s order by s.unit, s.split_index), '[]') from run_splits s where s.run_id = runs.id) as parts_splits,
  (select coalesce(json_agg(l order by l.lap_index), '[]') from run_laps l where l.run_id = runs.id) as parts_laps,
  (select coalesce(json_agg(f order by f.distance_m), '[]') from run_fastest_sections f where f.run_id = runs.id) as parts_fastest
  from "runs" where "id" = :'run' limit 1;
