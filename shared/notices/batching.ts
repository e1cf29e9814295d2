/**
 * When a batch of notices goes out (issue 16: "few and right e-mails"). Pure: the times come in.
 *
 * - Uploads: the page sends one request per file, so a drop of twelve files is twelve requests
 *   over a minute or more. A batch waits until no file has arrived for UPLOAD_QUIET_SECONDS, and
 *   never longer than UPLOAD_BATCH_MAX_SECONDS after its first file (a steady stream still gets out).
 * - Notes: at most one e-mail per person per NOTE_BATCH_SECONDS; the batch opens with the first new
 *   note and lists every note written until it goes out.
 * - Pain alerts and a runner leaving a squad: at once.
 */
export const UPLOAD_QUIET_SECONDS = 60;
export const UPLOAD_BATCH_MAX_SECONDS = 10 * 60;
export const NOTE_BATCH_SECONDS = 15 * 60;

export type BatchedNoticeKind = 'import' | 'note' | 'pain_alert' | 'squad_leave';

/** The moment a batch whose rows were recorded at `createdAt` (at least one) is due. */
export function batchDueAt(kind: BatchedNoticeKind, createdAt: readonly Date[]): Date {
  if (createdAt.length === 0) throw new RangeError('A batch has at least one notice.');
  const times = createdAt.map((d) => d.getTime());
  const first = Math.min(...times);
  const last = Math.max(...times);
  switch (kind) {
    case 'import':
      return new Date(Math.min(last + UPLOAD_QUIET_SECONDS * 1000, first + UPLOAD_BATCH_MAX_SECONDS * 1000));
    case 'note':
      return new Date(first + NOTE_BATCH_SECONDS * 1000);
    case 'pain_alert':
    case 'squad_leave':
      return new Date(first);
  }
}

/**
 * A check-in soreness from this step up (of 1–5) is high: it alerts the coach at once, and the
 * digest and week review count it (our choice: the top two steps of the scale).
 */
export const HIGH_SORENESS = 4;

/** Failed sends are tried again after 1, 2, 4, 8 minutes; after NOTICE_MAX_ATTEMPTS the batch is given up (and logged). */
export const NOTICE_MAX_ATTEMPTS = 5;
export function retryDelaySeconds(attempts: number): number {
  return 60 * 2 ** Math.max(0, attempts - 1);
}
