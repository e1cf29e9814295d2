// The public face of the fuel feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { findFuelTakenOf, findRunCheckinsOf } from './fuel-reads.service.ts';
export { plannedFuelTotalsOf } from './fuel.service.ts';
