import { cleanPoints } from '../../../../shared/tracks/clean.ts';
import type { CleanTrack, DeviceLap, RawTrack } from '../../../../shared/tracks/types.ts';
import { decodeXml, detectFormat, gunzipIfNeeded, rejectBinary, type TrackFormat } from './detect.ts';
import { readGpx } from './gpx-reader.ts';
import { ImportRejection } from './import-rejection.ts';
import { readTcx } from './tcx-reader.ts';
import { XmlReadError } from './xml-events.ts';

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
 * file cannot become a run. Nothing here touches storage.
 */
export function parseTrackFile(input: Buffer): ParsedRun[] {
  if (input.length === 0) throw new ImportRejection('empty-file', 'This file is empty.');
  const buffer = gunzipIfNeeded(input);
  rejectBinary(buffer);
  const text = decodeXml(buffer);
  const format = detectFormat(text);
  try {
    return format === 'gpx' ? runsFromGpx(text) : runsFromTcx(text);
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

function runsFromGpx(text: string): ParsedRun[] {
  const contents = readGpx(text);
  if (contents.track.points.length === 0) {
    if (contents.tracks === 0 && (contents.waypoints > 0 || contents.routePoints > 0)) {
      throw new ImportRejection('no-recorded-track', 'This file only has waypoints or a planned route, not a recorded track.');
    }
    throw new ImportRejection('empty-track', "This file's track is empty.");
  }
  return [toRun(contents.track, 0)];
}

function runsFromTcx(text: string): ParsedRun[] {
  const contents = readTcx(text);
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
  return runs;
}

function toRun(raw: RawTrack, index: number): ParsedRun {
  const total = raw.points.length;
  if (total === 0) throw new ImportRejection('empty-track', "This file's track is empty.");
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
  return { format: raw.format, activity_index: index, name: raw.name, sport: raw.sport, track, laps: raw.laps };
}
