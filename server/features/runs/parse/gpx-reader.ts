import { PointColumns, pointCapacityFor } from '../../../../shared/tracks/point-columns.ts';
import type { RawTrack, TrackPoint } from '../../../../shared/tracks/types.ts';
import { parseIsoTime, parseNumber } from './parse-time.ts';
import { readXmlEvents, type XmlBytes } from './xml-events.ts';

/** What a GPX file holds besides its track, to explain a rejection. */
export interface GpxContents {
  track: RawTrack;
  tracks: number;
  waypoints: number;
  routePoints: number;
}

/** Extension element names (any namespace) that carry heart rate, cadence and temperature. */
const HR_NAMES = new Set(['hr', 'heartrate', 'heart_rate']);
const CAD_NAMES = new Set(['cad', 'cadence', 'runcadence']);
const TEMP_NAMES = new Set(['atemp', 'temp', 'temperature', 'wtemp']);

/**
 * Read a GPX 1.0 or 1.1 document: every `trk` and `trkseg` becomes one segment of a single run
 * (segments are pauses, never joined); `trkpt` gives lat/lon (attributes), `ele`, `time` and,
 * from any extension under any namespace prefix, heart rate, cadence and temperature.
 */
export function readGpx(xml: XmlBytes): GpxContents {
  const points = new PointColumns(pointCapacityFor(xml.bytes.length));
  /** Where each segment begins in `points`; points always go to the segment opened last. */
  const segmentStarts: number[] = [];
  const stack: string[] = [];
  let tracks = 0;
  let waypoints = 0;
  let routePoints = 0;
  let name: string | null = null;
  let sport: string | null = null;
  let segmentOpen = false;
  let point: TrackPoint | null = null;
  let pointDepth = -1;

  readXmlEvents(
    xml,
    {
      open(tag, attrs) {
        const parent = stack[stack.length - 1];
        stack.push(tag);
        if (tag === 'trk' && parent === 'gpx') tracks++;
        else if (tag === 'wpt') waypoints++;
        else if (tag === 'rtept') routePoints++;
        else if (tag === 'trkseg' && parent === 'trk') {
          segmentStarts.push(points.length);
          segmentOpen = true;
        } else if (tag === 'trkpt' && (parent === 'trkseg' || parent === 'trk')) {
          if (parent === 'trk' && !segmentOpen) {
            segmentStarts.push(points.length);
            segmentOpen = true;
          }
          point = { t: Number.NaN, lat: parseNumber(attrs.lat), lon: parseNumber(attrs.lon) };
          pointDepth = stack.length;
        }
      },
      text(value) {
        const tag = stack[stack.length - 1] ?? '';
        const parent = stack[stack.length - 2];
        if (point) {
          const lower = tag.toLowerCase();
          if (stack.length === pointDepth + 1) {
            if (tag === 'time') point.t = parseIsoTime(value);
            else if (tag === 'ele') point.ele = parseNumber(value);
          } else if (HR_NAMES.has(lower)) point.hr = parseNumber(value);
          else if (CAD_NAMES.has(lower)) point.cad = parseNumber(value);
          else if (TEMP_NAMES.has(lower)) point.temp = parseNumber(value);
        } else if (parent === 'trk' && tracks === 1) {
          if (tag === 'name' && name === null) name = value;
          else if (tag === 'type' && sport === null) sport = value;
        }
      },
      close(tag) {
        if (tag === 'trkpt' && point && stack.length === pointDepth) {
          if (segmentOpen) points.push(point);
          point = null;
          pointDepth = -1;
        } else if (tag === 'trkseg' || tag === 'trk') {
          segmentOpen = false;
        }
        stack.pop();
      },
    },
    { repeatedElement: 'trkpt' },
  );
  return {
    track: {
      format: 'gpx',
      name,
      sport,
      points,
      segment_starts: segmentStarts.filter((start, k) => start < (segmentStarts[k + 1] ?? points.length)),
      laps: [],
    },
    tracks,
    waypoints,
    routePoints,
  };
}
