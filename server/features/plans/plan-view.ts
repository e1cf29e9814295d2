import { formatShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import type { NamedPlanRow } from './plans.repository.ts';

/** A stored plan as every answer shows it: the parts, and the same parts as shorthand text. */
export interface StoredPlan {
  id: string;
  runner_id: string;
  author_id: string | null;
  author_name: string | null;
  date: string;
  title: string;
  notes: string;
  text: string;
  parts: PlanItem[];
  created_at: string;
  updated_at: string;
  updated_by_name: string | null;
}

export function toPlan(row: NamedPlanRow): StoredPlan {
  const parts = row.items as PlanItem[];
  return {
    id: row.id,
    runner_id: row.runner_id,
    author_id: row.author_id,
    author_name: row.author_name ?? null,
    date: row.date,
    title: row.title,
    notes: row.notes,
    text: formatShorthand(parts),
    parts,
    created_at: row.created_at.toISOString(),
    updated_at: row.updated_at.toISOString(),
    updated_by_name: row.updated_by_name ?? null,
  };
}
