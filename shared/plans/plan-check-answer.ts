/**
 * The plan-check answer (`GET /api/runs/:id/plan-check`), declared once: the route declares it as its
 * response (so /api/openapi.json shows it), the server's answer is typed by it, and the client imports
 * the inferred `PlanCheckAnswer` (no hand-written copy). The computation's own types in plan-check.ts
 * are checked below to describe the same JSON.
 */
import { z } from 'zod';
import { DISTANCE_UNITS, PART_KINDS } from './types.ts';
import type { RepBlock } from './rep-blocks.ts';
import type { PartCheck, PlanCheckResult } from './plan-check.ts';
import { PlanSchema } from './schemas.ts';

export const PartVerdictSchema = z.enum(['on pace', 'quick', 'slow', 'cut short', 'extended', 'missed', 'by feel']);
export const PlanSessionVerdictSchema = z.enum(['as planned', 'partly', 'missed', 'unplanned']);

export const PartCheckSchema = z.object({
  /** 0-based position in the plan's expanded list (the table shows it + 1). */
  index: z.number(),
  kind: z.enum(PART_KINDS),
  planned: z.object({
    distance_m: z.number().optional(),
    duration_s: z.number().optional(),
    pace_fast_s_per_km: z.number().optional(),
    pace_slow_s_per_km: z.number().optional(),
    hr_low_bpm: z.number().optional(),
    hr_high_bpm: z.number().optional(),
  }),
  actual: z.object({
    distance_m: z.number(),
    /** Clock time of the part, s. */
    duration_s: z.number(),
    /** Moving time (stops left out), s; the pace uses it. Absent in results stored before issue #14. */
    moving_s: z.number().optional(),
    /** Stops inside the part: how many and their total clock time, s. Absent as above. */
    stops: z.object({ count: z.number(), seconds: z.number() }).optional(),
    pace_s_per_km: z.number().nullable(),
    avg_hr: z.number().nullable(),
    start_t: z.number(),
    end_t: z.number(),
  }),
  /** Seconds per km outside the target range (negative = quicker), 0 inside it; null without a pace target. */
  difference_s_per_km: z.number().nullable(),
  verdict: PartVerdictSchema,
  /** Why, in a few words, when the verdict is not simply from the pace. */
  note: z.string().nullable(),
});

/** A part as answered: with `unresolved`, why a race-named pace (@ MP …) could not be turned into a number. */
export const PlanCheckPartSchema = PartCheckSchema.extend({ unresolved: z.string().optional() });

/** One repeated step of a repeat block at a glance (shared/plans/rep-blocks.ts). */
export const RepBlockSchema = z.object({
  item_index: z.number(),
  step: z.number(),
  kind: z.enum(PART_KINDS),
  amount: z.union([z.object({ distance_m: z.number(), unit: z.enum(DISTANCE_UNITS) }), z.object({ duration_s: z.number() })]),
  reps: z.number(),
  run: z.number(),
  on_pace: z.number(),
  paces_s_per_km: z.array(z.number().nullable()),
  average_s_per_km: z.number().nullable(),
  fastest_s_per_km: z.number().nullable(),
  slowest_s_per_km: z.number().nullable(),
  first_to_last_s_per_km: z.number().nullable(),
});

export const PlanCheckAnswerSchema = z.object({
  plan_id: z.string().nullable(),
  plan: PlanSchema.nullable(),
  /** How the plan was found: chosen by the runner, or the first plan on the run's local date. */
  linked: z.enum(['chosen', 'same day']).nullable(),
  /** Share of the target pace either side that still counts as on pace (0.02 = ±2 %). */
  tolerance: z.number(),
  method: z.enum(['device laps', 'planned amounts']),
  session_verdict: PlanSessionVerdictSchema,
  parts: z.array(PlanCheckPartSchema),
  /** Each repeat block's reps on one line: paces, on pace, average, fastest, slowest, first to last. */
  rep_blocks: z.array(RepBlockSchema),
});
export type PlanCheckAnswer = z.infer<typeof PlanCheckAnswerSchema>;
export type PlanCheckPart = z.infer<typeof PlanCheckPartSchema>;

// The computation's types in plan-check.ts and these schemas must describe the same JSON.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const PART_MATCHES: Same<z.infer<typeof PartCheckSchema>, PartCheck> = true;
const BLOCK_MATCHES: Same<z.infer<typeof RepBlockSchema>, RepBlock> = true;
const RESULT_MATCHES: Same<Pick<PlanCheckAnswer, 'method' | 'session_verdict'>, Omit<PlanCheckResult, 'parts'>> = true;
void [PART_MATCHES, BLOCK_MATCHES, RESULT_MATCHES];
