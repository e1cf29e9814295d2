// The public face of the fees feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { feeOfSquad } from './fees.service.ts';
