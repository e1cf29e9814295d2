// The public face of the squads feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  assertCanPlanFor,
  assertCanReadRunner,
  isSquadMember,
  squadCoachedBy,
  squadCoachedOrJoinedBy,
  squadJoinedBy,
} from './runner-access.ts';
export { findCoachIdsOfRunner, findSquadById, listMembers, listSquadsWithCoach } from './squad-reads.service.ts';
export { invitationVouchesFor } from './squads.service.ts';
