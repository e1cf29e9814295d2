import { formatFileSize } from '../units.ts';

/**
 * Limits on what one uploaded track may cost the server (issue 13). The numbers and why they were
 * chosen are in server/features/runs/README.md; the sentences here are what a runner reads.
 */

/** Track points in one file, at most: 55 hours at one point a second, far past any single run. */
export const MAX_TRACK_POINTS = 200_000;
/** First to last timestamp of one run, at most (a 24-hour race recorded end to end is half of this). */
export const MAX_TRACK_HOURS = 48;
/** Files below this size are never judged by their track's share: they cost little whatever they hold. */
export const TRACK_SHARE_MIN_FILE_BYTES = 1024 * 1024;
/**
 * Generous size of one track point with its time, elevation, heart rate and extensions: real GPX
 * files take 90–400 bytes a point and TCX files 450–900 (fixtures/gps-samples).
 */
export const BYTES_PER_TRACK_POINT_ALLOWANCE = 1024;
/** Below this share of the file (points × allowance ÷ size) the track is "a tiny share" and the file is refused. */
export const MIN_TRACK_SHARE = 0.1;

const thousands = (n: number) => Math.round(n).toLocaleString('en-US').replace(/,/g, ' ');

/** A sentence when a file holds more points than one run may, else null. */
export function tooManyPointsReason(points: number): string | null {
  if (points <= MAX_TRACK_POINTS) return null;
  return `This file holds more than ${thousands(MAX_TRACK_POINTS)} track points, more than one run ever needs (about 55 hours at one point a second). Split it into single runs, or export it with fewer points, and upload those.`;
}

/** A sentence when a run lasts longer than one run may (first to last timestamp), else null. */
export function tooLongReason(durationS: number): string | null {
  if (!(durationS > MAX_TRACK_HOURS * 3600)) return null;
  const hours = Math.floor(durationS / 3600);
  const minutes = Math.floor((durationS % 3600) / 60);
  const lasts = minutes > 0 ? `${hours} hours ${minutes} min` : `more than ${hours} hours`;
  return `This track lasts ${lasts} from its first to its last point; one run can last at most ${MAX_TRACK_HOURS} hours. If the watch kept recording between runs, split the file into single runs and upload those.`;
}

/** The track's estimated share of the file: points × the per-point allowance ÷ the file's size, capped at 1. */
export function trackShareOf(fileBytes: number, points: number): number {
  if (fileBytes <= 0) return 1;
  return Math.min(1, (points * BYTES_PER_TRACK_POINT_ALLOWANCE) / fileBytes);
}

/**
 * A sentence when the track is a tiny share of a large file (megabytes of comments, pictures or
 * padding around a short track), else null. `fileBytes` is the document's size once uncompressed.
 */
export function tinyTrackShareReason(fileBytes: number, points: number): string | null {
  if (fileBytes < TRACK_SHARE_MIN_FILE_BYTES) return null;
  const share = trackShareOf(fileBytes, points);
  if (share >= MIN_TRACK_SHARE) return null;
  return `This file is ${formatFileSize(fileBytes)} but its track of ${thousands(points)} points fills less than ${Math.round(MIN_TRACK_SHARE * 100)} % of it; the rest is not GPS data. Export the run again from your watch or app, without notes or attachments, and upload that.`;
}

/** The answer when an upload would take a runner past their storage quota. */
export function storageFullReason(usedBytes: number, quotaBytes: number): string {
  return `Your storage is full: ${formatFileSize(usedBytes)} of your ${formatFileSize(quotaBytes)} is used by original files. Delete runs you no longer need to make room; nothing from this upload was stored.`;
}

/** The answer when an upload, still arriving, grows past what is left of the runner's storage. */
export function uploadDoesNotFitReason(usedBytes: number, quotaBytes: number): string {
  return `This upload does not fit in your storage: ${formatFileSize(usedBytes)} of your ${formatFileSize(quotaBytes)} is already used by original files. Delete runs you no longer need to make room; nothing from this upload was stored.`;
}

/** A file refused because it does not fit in what is left of the runner's storage. */
export function overQuotaReason(usedBytes: number, fileBytes: number, quotaBytes: number): string {
  return `This file (${formatFileSize(fileBytes)}) does not fit in your storage: ${formatFileSize(usedBytes)} of your ${formatFileSize(quotaBytes)} is used by original files. Delete runs you no longer need to make room.`;
}
