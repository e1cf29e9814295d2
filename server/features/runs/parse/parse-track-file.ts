import {
  MAX_TRACK_POINTS,
  tinyTrackShareReason,
  tooLongReason,
  tooManyPointsReason,
} from '../../../../shared/runs/upload-limits.ts';
import { cleanPoints } from '../../../../shared/tracks/clean.ts';
import { pointCapacityFor } from '../../../../shared/tracks/point-columns.ts';
import type { CleanTrack, DeviceLap, RawTrack } from '../../../../shared/tracks/types.ts';
import { arrivalFrom, ArrivalStopped, type Arrival } from './arriving.ts';
import {
  detectFormat,
  formatFromHead,
  gunzipIfNeeded,
  HEAD_BYTES,
  rejectBinary,
  xmlBytesOf,
  type TrackFormat,
} from './detect.ts';
import { readGpx } from './gpx-reader.ts';
import { ImportRejection } from './import-rejection.ts';
import type { ReadOptions } from './point-template.ts';
import { countPointTagsIn, PointTagCounter, pointTagName } from './point-tags.ts';
import { readTcx } from './tcx-reader.ts';
import { XmlReadError, type XmlBytes } from './xml-events.ts';

/** One run found in a file, cleaned and ready for `analyseTrack`. */
export interface ParsedRun {
  format: TrackFormat;
  /** 0-based position of the activity in a TCX file; 0 for GPX. */
  activity_index: number;
  name: string | null;
  sport: string | null;
  track: CleanTrack;
  laps: DeviceLap[];
}

/** Share of points that may lack a timestamp before the file counts as having no timestamps. */
const MAX_UNTIMED_SHARE = 0.5;

/**
 * Read an uploaded file (GPX 1.0/1.1 or TCX, possibly gzip-compressed; the format is detected
 * from the content, never from the name) into its runs: one for a GPX file, one per usable
 * `Activity` of a TCX file. Throws `ImportRejection` with a sentence for the runner when the
 * file cannot become a run. Nothing here touches storage. `options` are for tests: the result
 * is the same with and without the point templates (point-template.ts).
 */
export function parseTrackFile(input: Buffer, options: ReadOptions = {}): ParsedRun[] {
  if (input.length === 0) throw new ImportRejection('empty-file', 'This file is empty.');
  const buffer = gunzipIfNeeded(input);
  rejectBinary(buffer);
  // Bytes, not text: the readers decode only what saxes reads (xml-events.ts), never the track points.
  const doc = xmlBytesOf(buffer);
  const format = detectFormat(doc);
  // Point tags are counted while the file is read (point-tags.ts): a file over the limit is refused
  // once its count passes it, before more points than that are kept, with no pass of its own.
  const pointTags = new PointTagCounter(doc.bytes, format);
  try {
    // Room for the points at once (one per 100 bytes, at most the limit); pages never written cost no memory.
    const expectedPoints = Math.min(pointCapacityFor(doc.bytes.length), MAX_TRACK_POINTS);
    const readOptions: ReadOptions = { expectedPoints, ...options, pointTags };
    const { runs, points } = format === 'gpx' ? runsFromGpx(doc, readOptions) : runsFromTcx(doc, readOptions);
    const tiny = tinyTrackShareReason(buffer.length, points);
    if (tiny) throw new ImportRejection('tiny-track-share', tiny);
    return runs;
  } catch (error) {
    // Too many points is the answer whatever else is wrong with the file, as when the count came first.
    if (!(error instanceof ImportRejection && error.code === 'too-many-points')) {
      const tooMany = tooManyPointsReason(countTrackPointTags(doc, format));
      if (tooMany) throw new ImportRejection('too-many-points', tooMany);
    }
    if (error instanceof XmlReadError) {
      throw new ImportRejection(
        'malformed-xml',
        'This file is damaged: its XML could not be read, so no track could be taken from it.',
      );
    }
    throw error;
  }
}

/**
 * `parseTrackFile` of a file still arriving (arriving.ts), read as its bytes come: the same runs, or the
 * same refusal, as `parseTrackFile` of the whole file gives. Null when this file is read after it has
 * arrived instead (gzip, UTF-16, a binary or a head that names no track: `parseTrackFile` decides). Throws
 * `ArrivalStopped` when the bytes stop coming (the caller then reads the file after arrival, or not at all).
 *
 * How it stays the same: the encoding and the byte-order mark come from the first bytes, as in
 * `xmlBytesOf`; the format is guessed from the head (its root element) and confirmed by `detectFormat`
 * on the whole file before the runs are given; the reader (xml-events.ts) reads exactly the stretches
 * and elements it reads on the whole file, waiting for bytes before it looks at them. Anything that goes
 * wrong while it reads (a refusal, broken XML, too many points) is answered by `parseTrackFile` on the
 * whole file once it has arrived, so every refusal is word for word today's. Only the room first made for
 * the points differs (from the memory's size, not the file's), which no result shows.
 */
export function parseArrivingTrackFile(arrival: Arrival, options: ReadOptions = {}): ParsedRun[] | null {
  const arrived = arrival.waitFor(HEAD_BYTES);
  const whole = (): Buffer => {
    while (arrival.length < 0) arrival.waitFor(Number.MAX_SAFE_INTEGER);
    return arrival.memory.subarray(0, arrival.length);
  };
  // Small enough to have arrived with its head: nothing to overlap.
  if (arrival.length >= 0) return parseTrackFile(whole(), options);
  const head = arrival.memory.subarray(0, arrived);
  if (head[0] === 0x1f && head[1] === 0x8b) return null;
  if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return null;
  try {
    rejectBinary(head);
  } catch {
    return null;
  }
  const { bytes: headBytes, encoding } = xmlBytesOf(head);
  const skipped = head.length - headBytes.length;
  const format = formatFromHead({ bytes: headBytes, encoding });
  if (format === null) return null;

  const bytes = arrival.memory.subarray(skipped);
  const doc = { bytes, encoding, arriving: arrivalFrom(arrival, skipped) };
  const pointTags = new PointTagCounter(bytes, format, true);
  try {
    // The memory is a little longer than the file (the request's declared length): room for a few more points.
    const expectedPoints = Math.min(pointCapacityFor(bytes.length), MAX_TRACK_POINTS);
    const readOptions: ReadOptions = { expectedPoints, ...options, pointTags };
    const { runs, points } = format === 'gpx' ? runsFromGpx(doc, readOptions) : runsFromTcx(doc, readOptions);
    const file = whole();
    // What parseTrackFile checks before it reads, now on the whole file; anything else than a match is its answer.
    if (detectFormat({ bytes: file.subarray(skipped), encoding }) !== format) return parseTrackFile(file, options);
    if (tinyTrackShareReason(file.length, points)) return parseTrackFile(file, options);
    return runs;
  } catch (error) {
    if (error instanceof ArrivalStopped) throw error;
    // Refused, damaged or over a limit: the whole file's reading gives the answer, in its words and order.
    return parseTrackFile(whole(), options);
  }
}

/**
 * Opening tags of track points (`<trkpt`, `<Trackpoint`, with any namespace prefix), found with
 * indexOf: an upper bound of the points the reader will collect (comments are counted too).
 */
export function countTrackPointTags({ bytes }: XmlBytes, format: TrackFormat): number {
  return countPointTagsIn(bytes, Buffer.from(pointTagName(format), 'latin1'), 0, bytes.length);
}

function runsFromGpx(text: XmlBytes, options: ReadOptions): { runs: ParsedRun[]; points: number } {
  const contents = readGpx(text, options);
  if (contents.track.points.length === 0) {
    if (contents.tracks === 0 && (contents.waypoints > 0 || contents.routePoints > 0)) {
      throw new ImportRejection('no-recorded-track', 'This file only has waypoints or a planned route, not a recorded track.');
    }
    throw new ImportRejection('empty-track', "This file's track is empty.");
  }
  // Counted before cleaning, which cleans the reader's columns in place.
  const points = contents.track.points.length;
  return { runs: [toRun(contents.track, 0)], points };
}

function runsFromTcx(text: XmlBytes, options: ReadOptions): { runs: ParsedRun[]; points: number } {
  const contents = readTcx(text, options);
  if (contents.activities.length === 0) {
    if (contents.courses > 0) {
      throw new ImportRejection('no-recorded-track', 'This file only has a planned course, not a recorded run.');
    }
    throw new ImportRejection('empty-track', 'This file has no recorded activity.');
  }
  // Counted before cleaning, which cleans the reader's columns in place.
  const points = contents.activities.reduce((sum, a) => sum + a.points.length, 0);
  const runs: ParsedRun[] = [];
  let firstRejection: ImportRejection | null = null;
  contents.activities.forEach((activity, index) => {
    try {
      runs.push(toRun(activity, index));
    } catch (error) {
      if (!(error instanceof ImportRejection)) throw error;
      firstRejection ??= error;
    }
  });
  if (runs.length === 0 && firstRejection) throw firstRejection;
  return { runs, points };
}

function toRun(raw: RawTrack, index: number): ParsedRun {
  const total = raw.points.length;
  if (total === 0) throw new ImportRejection('empty-track', "This file's track is empty.");
  const tooMany = tooManyPointsReason(total);
  if (tooMany) throw new ImportRejection('too-many-points', tooMany);
  // The reader's columns are dropped after cleaning: cleaned in place.
  const track = cleanPoints(raw.points, raw.segment_starts, { reuseInput: true });
  const { report } = track;
  if (report.dropped_untimed === total) {
    throw new ImportRejection('no-timestamps', 'This file has no timestamps, so splits cannot be computed.');
  }
  if (report.dropped_untimed > total * MAX_UNTIMED_SHARE) {
    throw new ImportRejection(
      'no-timestamps',
      `Most points in this file have no timestamps (${report.dropped_untimed} of ${total}), so splits cannot be computed.`,
    );
  }
  if (track.columns.length === 0) {
    throw new ImportRejection('no-valid-points', "This file's track has no valid positions or distances.");
  }
  if (track.columns.length === 1) {
    throw new ImportRejection('single-point', "This file's track has a single point, so there is no distance or time to split.");
  }
  const times = track.columns.t;
  const tooLong = tooLongReason((times[track.columns.length - 1]! - times[0]!) / 1000);
  if (tooLong) throw new ImportRejection('too-long', tooLong);
  return { format: raw.format, activity_index: index, name: raw.name, sport: raw.sport, track, laps: raw.laps };
}
