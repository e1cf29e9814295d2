// The public face of the notices feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { recordSwitchChanges } from './unsubscribe.service.ts';
export {
  type NoticeDeps,
  recordNoteNotice,
  recordSorenessAlert,
  recordSquadLeave,
  recordUploadNotice,
  unsubscribeHeaders,
  unsubscribeLinks,
} from './notices.service.ts';
