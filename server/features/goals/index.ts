// The public face of the goals feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  findGoalRace,
  findGoalRacesOf,
  listRaceResults,
  listRaceResultsOf,
  toGoalRace,
  toRaceResult,
} from './goal-reads.service.ts';
