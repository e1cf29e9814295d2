import { raceEquivalents } from '../../../shared/race/equivalence.ts';
import { deprecatedTrainingPaces } from '../../../shared/race/deprecated-training-paces.ts';
import { paceFromGoal, splitTable } from '../../../shared/race/paces.ts';
import {
  EquivalentsQuerySchema,
  EquivalentsResponseSchema,
  PacesQuerySchema,
  PacesResponseSchema,
  type EquivalentsResponse,
  type PacesResponse,
} from '../../../shared/race/schemas.ts';
import { trainingRanges } from '../../../shared/race/training-ranges.ts';
import { createApiRouter } from '../../lib/api-router.ts';

// Pure computation on the query alone (shared/race): no service or repository tier, nothing is stored.
export function createToolsRouter() {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/tools/equivalents',
      tag: 'tools',
      summary:
        'Equivalent times for a race result (distance_m, time_s) at 1500 m, the mile, 3000 m, 5K, 10K, 15K, the half and the marathon, by Riegel (1981, b = 1.06) and by the Daniels & Gilbert (1979) equations',
      access: 'own-data',
      query: EquivalentsQuerySchema,
      response: EquivalentsResponseSchema,
    },
    (_req, res) => {
      const { distance_m, time_s } = res.locals.query;
      const body: EquivalentsResponse = { equivalents: raceEquivalents(distance_m, time_s) };
      res.json(body);
    },
  );

  api.route(
    {
      method: 'get',
      path: '/tools/paces',
      tag: 'tools',
      summary:
        'For a goal or result (distance_m, time_s): pace per km and per mile, a split table per unit (mi default, or km) with an optional negative split in seconds (negative_split_s; two even halves), 5 km checkpoints, and training pace ranges: easy and steady (set from marathon effort, our own choice) and mile, 5K, 10K, half marathon and marathon effort (race equivalents by Riegel 1981 and Daniels & Gilbert 1979). include=training_paces adds the deprecated field of the previous release',
      access: 'own-data',
      query: PacesQuerySchema,
      response: PacesResponseSchema,
    },
    (_req, res) => {
      const { distance_m, time_s, unit, negative_split_s, include } = res.locals.query;
      const body: PacesResponse = {
        distance_m,
        time_s,
        pace: paceFromGoal(distance_m, time_s),
        split_table: splitTable(distance_m, time_s, { unit, negativeSplitS: negative_split_s }),
        training_ranges: trainingRanges(distance_m, time_s),
        ...(include === 'training_paces' ? { training_paces: deprecatedTrainingPaces(distance_m, time_s) } : {}),
      };
      res.json(body);
    },
  );

  return api;
}
