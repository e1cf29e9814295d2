import { POINT_FIELDS, PointColumns, pointCapacityFor, type PointField } from '../../../../shared/tracks/point-columns.ts';
import type { RawTrack, TrackPoint } from '../../../../shared/tracks/types.ts';
import { parseIsoTime, parseNumber } from './parse-time.ts';
import { TemplatePointReader, type PointPlan, type ReadOptions, type TemplateShape } from './point-template.ts';
import { readXmlEvents, type XmlBytes } from './xml-events.ts';

/** What a GPX file holds besides its track, to explain a rejection. */
export interface GpxContents {
  track: RawTrack;
  tracks: number;
  waypoints: number;
  routePoints: number;
  /** Points read by a template (point-template.ts) rather than through the events. */
  templatePoints: number;
}

/** Extension element names (any namespace) that carry heart rate, cadence and temperature. */
const HR_NAMES = new Set(['hr', 'heartrate', 'heart_rate']);
const CAD_NAMES = new Set(['cad', 'cadence', 'runcadence']);
const TEMP_NAMES = new Set(['atemp', 'temp', 'temperature', 'wtemp']);
/** Elements whose start or end changes what the reader counts or where points go. */
const STRUCTURE_NAMES = new Set(['trk', 'trkseg', 'trkpt', 'wpt', 'rtept']);

/**
 * The point field a text inside a `trkpt` sets, by its element's local name and how many levels
 * below the point that element is (1 for the point's own children, `time` and `ele`; deeper for
 * extensions, any namespace); null for any other text.
 */
function gpxTextField(tag: string, depth: number): PointField | null {
  if (depth === 1) return tag === 'time' ? 't' : tag === 'ele' ? 'ele' : null;
  const lower = tag.toLowerCase();
  if (HR_NAMES.has(lower)) return 'hr';
  if (CAD_NAMES.has(lower)) return 'cad';
  if (TEMP_NAMES.has(lower)) return 'temp';
  return null;
}

/** The same rules as the events below, for a point read by a template (point-template.ts). */
function planGpxPoint({ elements, slots }: TemplateShape): PointPlan | null {
  // The marker `<trkpt` also finds `<trkpts>`, which the events never take for a point.
  if (elements[0] !== 'trkpt' || elements.some((name, k) => k > 0 && STRUCTURE_NAMES.has(name))) return null;
  const fields = slots.map((slot) => {
    const depth = slot.path.length - 1;
    if (slot.kind === 'attribute') {
      // The point's own lat and lon; of two that lose their prefixes to the same name, the last counts.
      return depth === 0 && (slot.attribute === 'lat' || slot.attribute === 'lon') ? POINT_FIELDS.indexOf(slot.attribute) : -1;
    }
    const field = gpxTextField(slot.path[depth] as string, depth);
    return field === null ? -1 : POINT_FIELDS.indexOf(field);
  });
  // A trkpt always gives lat and lon (NaN when missing), so cleaning counts it as a given position.
  return { fields, positionGiven: true };
}

/**
 * Read a GPX 1.0 or 1.1 document: every `trk` and `trkseg` becomes one segment of a single run
 * (segments are pauses, never joined); `trkpt` gives lat/lon (attributes), `ele`, `time` and,
 * from any extension under any namespace prefix, heart rate, cadence and temperature.
 */
export function readGpx(xml: XmlBytes, options: ReadOptions = {}): GpxContents {
  const points = new PointColumns(options.expectedPoints ?? pointCapacityFor(xml.bytes.length));
  const { pointTags } = options;
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
  const pointReader = new TemplatePointReader({
    plan: planGpxPoint,
    // Where a trkpt would start a point that is kept: in an open segment, no point open.
    target: () => {
      const parent = stack[stack.length - 1];
      return point === null && segmentOpen && (parent === 'trkseg' || parent === 'trk') ? points : null;
    },
    counter: pointTags,
    tag: pointTags?.tag,
  });

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
          const field = gpxTextField(tag, stack.length - pointDepth);
          if (field === 't') point.t = parseIsoTime(value);
          else if (field !== null) point[field] = parseNumber(value);
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
    {
      repeatedElement: 'trkpt',
      pointReader: options.fastPoints === false ? undefined : pointReader,
      pointTags,
      arrivalLookahead: options.arrivalLookahead,
    },
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
    templatePoints: pointReader.read,
  };
}
