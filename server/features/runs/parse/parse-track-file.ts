import { tinyTrackShareReason, tooLongReason, tooManyPointsReason } from '../../../../shared/runs/upload-limits.ts';
import { cleanPoints } from '../../../../shared/tracks/clean.ts';
import type { CleanTrack, DeviceLap, RawTrack } from '../../../../shared/tracks/types.ts';
import { detectFormat, gunzipIfNeeded, rejectBinary, xmlBytesOf, type TrackFormat } from './detect.ts';
import { readGpx } from './gpx-reader.ts';
import { ImportRejection } from './import-rejection.ts';
import type { ReadOptions } from './point-template.ts';
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
  // Counted before reading, so a file of a million points is refused in a fraction of its reading time.
  const pointTags = countTrackPointTags(doc, format);
  const tooMany = tooManyPointsReason(pointTags);
  if (tooMany) throw new ImportRejection('too-many-points', tooMany);
  try {
    const readOptions = { ...options, expectedPoints: pointTags };
    const { runs, points } = format === 'gpx' ? runsFromGpx(doc, readOptions) : runsFromTcx(doc, readOptions);
    const tiny = tinyTrackShareReason(buffer.length, points);
    if (tiny) throw new ImportRejection('tiny-track-share', tiny);
    return runs;
  } catch (error) {
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
 * Opening tags of track points (`<trkpt`, `<Trackpoint`, with any namespace prefix), found with
 * indexOf: an upper bound of the points the reader will collect (comments are counted too).
 */
export function countTrackPointTags({ bytes }: XmlBytes, format: TrackFormat): number {
  const tag = Buffer.from(format === 'gpx' ? 'trkpt' : 'Trackpoint', 'latin1');
  let count = 0;
  // ASCII bytes are the same characters in every encoding xmlBytesOf gives, and never part of another character.
  for (let at = bytes.indexOf(tag); at !== -1; at = bytes.indexOf(tag, at + tag.length)) {
    const before = bytes[at - 1];
    const after = bytes[at + tag.length];
    // `<trkpt ` or `<ns:trkpt>`, never `</trkpt>` or a longer name such as `<trkpts`.
    const opens =
      before === 0x3c /* < */ || (before === 0x3a /* : */ && bytes.lastIndexOf(0x3c, at) > bytes.lastIndexOf(0x2f, at));
    if (opens && (after === 0x20 || after === 0x3e || after === 0x09 || after === 0x0a || after === 0x0d || after === 0x2f))
      count++;
  }
  return count;
}

function runsFromGpx(text: XmlBytes, options: ReadOptions): { runs: ParsedRun[]; points: number } {
  const contents = readGpx(text, options);
  if (contents.track.points.length === 0) {
    if (contents.tracks === 0 && (contents.waypoints > 0 || contents.routePoints > 0)) {
      throw new ImportRejection('no-recorded-track', 'This file only has waypoints or a planned route, not a recorded track.');
    }
    throw new ImportRejection('empty-track', "This file's track is empty.");
  }
  return { runs: [toRun(contents.track, 0)], points: contents.track.points.length };
}

function runsFromTcx(text: XmlBytes, options: ReadOptions): { runs: ParsedRun[]; points: number } {
  const contents = readTcx(text, options);
  if (contents.activities.length === 0) {
    if (contents.courses > 0) {
      throw new ImportRejection('no-recorded-track', 'This file only has a planned course, not a recorded run.');
    }
    throw new ImportRejection('empty-track', 'This file has no recorded activity.');
  }
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
  return { runs, points: contents.activities.reduce((sum, a) => sum + a.points.length, 0) };
}

function toRun(raw: RawTrack, index: number): ParsedRun {
  const total = raw.points.length;
  if (total === 0) throw new ImportRejection('empty-track', "This file's track is empty.");
  const tooMany = tooManyPointsReason(total);
  if (tooMany) throw new ImportRejection('too-many-points', tooMany);
  const track = cleanPoints(raw.points, raw.segment_starts);
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
