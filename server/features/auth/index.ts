// The public face of the auth feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { confirmOwnPassword } from './auth.service.ts';
export { clearSessionCookie } from './sessions.service.ts';
