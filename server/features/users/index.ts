// The public face of the users feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  findUserByEmail,
  findUserById,
  findUsersByIds,
  insertUser,
  toProfile,
  toUser,
  updateUserProfile,
} from './users.repository.ts';
export { setPasswordHash } from './users.service.ts';
