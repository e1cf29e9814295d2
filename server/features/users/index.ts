// The public face of the users feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  createUser,
  findUserByEmail,
  findUserById,
  findUsersByIds,
  setPasswordHash,
  storePaceTolerance,
  toProfile,
  toUser,
} from './users.service.ts';
