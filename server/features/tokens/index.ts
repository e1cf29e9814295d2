// The public face of the tokens feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  endApiTokensOf,
  issueApiToken,
  listTokensOf,
  resolveApiToken,
  resolveApiTokenUser,
  revokeToken,
} from './tokens.service.ts';
