import { PointColumns, pointCapacityFor } from '../../../../shared/tracks/point-columns.ts';
import type { DeviceLap, RawTrack, TrackPoint } from '../../../../shared/tracks/types.ts';
import { parseIsoTime, parseNumber } from './parse-time.ts';
import { readXmlEvents, type XmlBytes } from './xml-events.ts';

/** What a TCX file holds: one run per `Activity`, and whether it has planned courses. */
export interface TcxContents {
  activities: RawTrack[];
  courses: number;
}

function orNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

/**
 * Read a TCX document. Each `Activity` is one run with its `Lap`s as recorded (start time,
 * TotalTimeSeconds, DistanceMeters, average/maximum heart rate) and its `Trackpoint`s (Time,
 * Position, AltitudeMeters, DistanceMeters, HeartRateBpm/Value, Cadence, and the RunCadence
 * extension). All trackpoints of an activity form one segment: laps are not pauses, and real
 * pauses show up as stretches without progress. Trackpoints without a position are kept (they
 * may carry the device distance).
 */
export function readTcx(xml: XmlBytes): TcxContents {
  const activities: RawTrack[] = [];
  const stack: string[] = [];
  let courses = 0;
  let activity: RawTrack | null = null;
  let lap: DeviceLap | null = null;
  let point: TrackPoint | null = null;

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
            points: new PointColumns(activities.length === 0 ? pointCapacityFor(xml.bytes.length) : undefined),
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
          switch (tag) {
            case 'Time':
              if (parent === 'Trackpoint') point.t = parseIsoTime(value);
              break;
            case 'LatitudeDegrees':
              point.lat = parseNumber(value);
              break;
            case 'LongitudeDegrees':
              point.lon = parseNumber(value);
              break;
            case 'AltitudeMeters':
              point.ele = parseNumber(value);
              break;
            case 'DistanceMeters':
              if (parent === 'Trackpoint') point.distance_m = parseNumber(value);
              break;
            case 'Value':
              if (parent === 'HeartRateBpm') point.hr = parseNumber(value);
              break;
            case 'Cadence':
              point.cad = parseNumber(value);
              break;
            case 'RunCadence':
              point.cad ??= parseNumber(value);
              break;
          }
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
    { repeatedElement: 'Trackpoint' },
  );
  return { activities, courses };
}
