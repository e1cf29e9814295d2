import type { Knex } from 'knex';
import * as m20261201000000 from './20261201000000_users_and_tokens.ts';
import * as m20261201000100 from './20261201000100_squads.ts';
import * as m20261201000200 from './20261201000200_runs.ts';
import * as m20261201000300 from './20261201000300_run_notes.ts';
import * as m20261201000400 from './20261201000400_goal_races.ts';
import * as m20261201000500 from './20261201000500_session_plans.ts';
import * as m20261201000600 from './20261201000600_squads_mail.ts';
import * as m20261201000700 from './20261201000700_fuel.ts';
import * as m20261201000800 from './20261201000800_imports.ts';
import * as m20261201000900 from './20261201000900_load_indexes.ts';
import * as m20261202001000 from './20261202001000_plan_check_results.ts';
import * as m20261205003000 from './20261205003000_sessions_and_credential_limits.ts';
import * as m20261205005000 from './20261205005000_coach_prescribes.ts';
import * as m20261205006000 from './20261205006000_conversation.ts';
import * as m20261205102000 from './20261205102000_pending_signups.ts';
import * as m20261205103000 from './20261205103000_activity_kind.ts';
import * as m20261205105000 from './20261205105000_notices.ts';
import * as m20261205107000 from './20261205107000_coach_fees.ts';
import * as m20261205116000 from './20261205116000_import_claimed_by.ts';
import * as m20261205117000 from './20261205117000_write_positions.ts';
import * as m20261205121000 from './20261205121000_week_cache.ts';
import * as m20261205121100 from './20261205121100_runs_list_keyset.ts';
import * as m20261205122000 from './20261205122000_shared_limits.ts';
import * as m20261205123000 from './20261205123000_import_leases.ts';
import * as m20261205124000 from './20261205124000_canonical_time_zones.ts';
import * as m20261205201000 from './20261205201000_track_blob_storage.ts';
import * as m20261206000100 from './20261206000100_track_layout.ts';
import * as m20261206000200 from './20261206000200_track_fk_deferred.ts';

interface Migration {
  up(knex: Knex): Promise<void>;
  down(knex: Knex): Promise<void>;
}

/** Every migration, in order. Add new files here as well (see DEVELOPERS.md, "Adding a migration"). */
const MIGRATIONS: Record<string, Migration> = {
  '20261201000000_users_and_tokens': m20261201000000,
  '20261201000100_squads': m20261201000100,
  '20261201000200_runs': m20261201000200,
  '20261201000300_run_notes': m20261201000300,
  '20261201000400_goal_races': m20261201000400,
  '20261201000500_session_plans': m20261201000500,
  '20261201000600_squads_mail': m20261201000600,
  '20261201000700_fuel': m20261201000700,
  '20261201000800_imports': m20261201000800,
  '20261201000900_load_indexes': m20261201000900,
  '20261202001000_plan_check_results': m20261202001000,
  '20261205003000_sessions_and_credential_limits': m20261205003000,
  '20261205005000_coach_prescribes': m20261205005000,
  '20261205006000_conversation': m20261205006000,
  '20261205102000_pending_signups': m20261205102000,
  '20261205103000_activity_kind': m20261205103000,
  '20261205105000_notices': m20261205105000,
  '20261205107000_coach_fees': m20261205107000,
  '20261205116000_import_claimed_by': m20261205116000,
  '20261205117000_write_positions': m20261205117000,
  '20261205121000_week_cache': m20261205121000,
  '20261205121100_runs_list_keyset': m20261205121100,
  '20261205122000_shared_limits': m20261205122000,
  '20261205123000_import_leases': m20261205123000,
  '20261205124000_canonical_time_zones': m20261205124000,
  '20261205201000_track_blob_storage': m20261205201000,
  '20261206000100_track_layout': m20261206000100,
  '20261206000200_track_fk_deferred': m20261206000200,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(MIGRATIONS).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => MIGRATIONS[name]!,
};
