// The squad screens' answers are declared once, in shared/: these are their inferred types.
export type { SquadDetail } from '../../../../shared/squads/schemas.ts';
export type { DigestReceipt, SquadOverview, SquadOverviewRow as OverviewRow } from '../../../../shared/weeks/squad-overview.ts';
