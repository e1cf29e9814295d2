import { POINT_FIELDS, PointColumns, pointCapacityFor, type PointField } from '../../../../shared/tracks/point-columns.ts';
import type { DeviceLap, RawTrack, TrackPoint } from '../../../../shared/tracks/types.ts';
import { parseIsoTime, parseNumber } from './parse-time.ts';
import { TemplatePointReader, type PointPlan, type ReadOptions, type TemplateShape } from './point-template.ts';
import { readXmlEvents, type XmlBytes } from './xml-events.ts';

/** What a TCX file holds: one run per `Activity`, and whether it has planned courses. */
export interface TcxContents {
  activities: RawTrack[];
  courses: number;
  /** Points read by a template (point-template.ts) rather than through the events. */
  templatePoints: number;
}

function orNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

/** Elements whose start or end changes what the reader counts or where points go. */
const STRUCTURE_NAMES = new Set(['Course', 'Activity', 'Lap', 'Trackpoint']);

/**
 * The point field a text inside a `Trackpoint` sets, by its element's and its parent's local
 * names; 'run-cadence' sets the cadence only when the point has none yet. Null for any other text.
 */
function tcxTextField(tag: string, parent: string | undefined): PointField | 'run-cadence' | null {
  switch (tag) {
    case 'Time':
      return parent === 'Trackpoint' ? 't' : null;
    case 'LatitudeDegrees':
      return 'lat';
    case 'LongitudeDegrees':
      return 'lon';
    case 'AltitudeMeters':
      return 'ele';
    case 'DistanceMeters':
      return parent === 'Trackpoint' ? 'distance_m' : null;
    case 'Value':
      return parent === 'HeartRateBpm' ? 'hr' : null;
    case 'Cadence':
      return 'cad';
    case 'RunCadence':
      return 'run-cadence';
    default:
      return null;
  }
}

const CADENCE = POINT_FIELDS.indexOf('cad');

/** The same rules as the events below, for a point read by a template (point-template.ts). */
function planTcxPoint({ elements, slots }: TemplateShape): PointPlan | null {
  // The marker `<Trackpoint` also finds `<Trackpoints>`, which the events never take for a point.
  if (elements[0] !== 'Trackpoint' || elements.some((name, k) => k > 0 && STRUCTURE_NAMES.has(name))) return null;
  let cadence = false;
  let position = false;
  const fields = slots.map((slot) => {
    if (slot.kind === 'attribute') return -1;
    const n = slot.path.length;
    // A text in the Trackpoint itself has the element outside as its parent: no rule uses a Trackpoint's own text.
    const field = tcxTextField(slot.path[n - 1] as string, slot.path[n - 2]);
    if (field === null) return -1;
    if (field === 'run-cadence') {
      if (cadence) return -1;
      cadence = true;
      return CADENCE;
    }
    if (field === 'cad') cadence = true;
    if (field === 'lat' || field === 'lon') position = true;
    return POINT_FIELDS.indexOf(field);
  });
  return { fields, positionGiven: position };
}

/**
 * Read a TCX document. Each `Activity` is one run with its `Lap`s as recorded (start time,
 * TotalTimeSeconds, DistanceMeters, average/maximum heart rate) and its `Trackpoint`s (Time,
 * Position, AltitudeMeters, DistanceMeters, HeartRateBpm/Value, Cadence, and the RunCadence
 * extension). All trackpoints of an activity form one segment: laps are not pauses, and real
 * pauses show up as stretches without progress. Trackpoints without a position are kept (they
 * may carry the device distance).
 */
export function readTcx(xml: XmlBytes, options: ReadOptions = {}): TcxContents {
  const activities: RawTrack[] = [];
  const stack: string[] = [];
  let courses = 0;
  let activity: RawTrack | null = null;
  let lap: DeviceLap | null = null;
  let point: TrackPoint | null = null;
  const { pointTags } = options;
  const pointReader = new TemplatePointReader({
    plan: planTcxPoint,
    // A Trackpoint anywhere in an activity starts a point.
    target: () => (activity !== null && point === null ? (activity as RawTrack).points : null),
    counter: pointTags,
    tag: pointTags?.tag,
  });

  readXmlEvents(
    xml,
    {
      open(tag, attrs) {
        stack.push(tag);
        if (tag === 'Course') courses++;
        else if (tag === 'Activity') {
          activity = {
            format: 'tcx',
            name: null,
            sport: attrs.Sport ?? null,
            // Room for the whole file in the first activity; any others grow as they need.
            points: new PointColumns(
              activities.length === 0 ? (options.expectedPoints ?? pointCapacityFor(xml.bytes.length)) : undefined,
            ),
            segment_starts: [0],
            laps: [],
          };
          activities.push(activity);
        } else if (tag === 'Lap' && activity) {
          lap = {
            start_t: parseIsoTime(attrs.StartTime ?? ''),
            total_time_s: null,
            distance_m: null,
            avg_hr: null,
            max_hr: null,
          };
          (activity as RawTrack).laps.push(lap);
        } else if (tag === 'Trackpoint' && activity) {
          point = { t: Number.NaN };
        }
      },
      text(value) {
        const tag = stack[stack.length - 1] ?? '';
        const parent = stack[stack.length - 2];
        if (point) {
          const field = tcxTextField(tag, parent);
          if (field === 't') point.t = parseIsoTime(value);
          else if (field === 'run-cadence') point.cad ??= parseNumber(value);
          else if (field !== null) point[field] = parseNumber(value);
        } else if (lap && parent === 'Lap') {
          if (tag === 'TotalTimeSeconds') lap.total_time_s = orNull(parseNumber(value));
          else if (tag === 'DistanceMeters') lap.distance_m = orNull(parseNumber(value));
        } else if (lap && tag === 'Value' && stack[stack.length - 3] === 'Lap') {
          if (parent === 'AverageHeartRateBpm') lap.avg_hr = orNull(parseNumber(value));
          else if (parent === 'MaximumHeartRateBpm') lap.max_hr = orNull(parseNumber(value));
        } else if (activity && parent === 'Activity' && tag === 'Notes') {
          (activity as RawTrack).name ??= value;
        }
      },
      close(tag) {
        if (tag === 'Trackpoint' && point && activity) {
          (activity as RawTrack).points.push(point);
          point = null;
        } else if (tag === 'Lap') lap = null;
        else if (tag === 'Activity') activity = null;
        stack.pop();
      },
    },
    {
      repeatedElement: 'Trackpoint',
      pointReader: options.fastPoints === false ? undefined : pointReader,
      pointTags,
      arrivalLookahead: options.arrivalLookahead,
    },
  );
  return { activities, courses, templatePoints: pointReader.read };
}
