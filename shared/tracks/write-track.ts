/**
 * Writers for GPX 1.1 and TCX documents from points (pure string building). Used by the
 * fixture generator and the demo seed; every value is written in the units the formats define.
 */
import type { DeviceLap, TrackPoint } from './types.ts';

function iso(t: number): string {
  return new Date(t).toISOString();
}

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * A GPX 1.1 document: one `trk` named `name`, one `trkseg` per segment; heart rate, cadence and
 * temperature in the common track-point extension (`gpxtpx` prefix).
 */
export function writeGpx(name: string, segments: readonly (readonly TrackPoint[])[]): string {
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<gpx version="1.1" creator="Pacewright fixture generator" xmlns="http://www.topografix.com/GPX/1/1" ' +
      'xmlns:gpxtpx="http://www.garmin.com/xmlschemas/TrackPointExtension/v1">',
    `<trk><name>${escapeXml(name)}</name><type>running</type>`,
  ];
  for (const segment of segments) {
    out.push('<trkseg>');
    for (const p of segment) {
      let line = `<trkpt lat="${p.lat}" lon="${p.lon}">`;
      if (p.ele !== undefined) line += `<ele>${p.ele}</ele>`;
      line += `<time>${iso(p.t)}</time>`;
      if (p.hr !== undefined || p.cad !== undefined || p.temp !== undefined) {
        line += '<extensions><gpxtpx:TrackPointExtension>';
        if (p.temp !== undefined) line += `<gpxtpx:atemp>${p.temp}</gpxtpx:atemp>`;
        if (p.hr !== undefined) line += `<gpxtpx:hr>${p.hr}</gpxtpx:hr>`;
        if (p.cad !== undefined) line += `<gpxtpx:cad>${p.cad}</gpxtpx:cad>`;
        line += '</gpxtpx:TrackPointExtension></extensions>';
      }
      out.push(`${line}</trkpt>`);
    }
    out.push('</trkseg>');
  }
  out.push('</trk>', '</gpx>', '');
  return out.join('\n');
}

/**
 * A TCX document with one `Activity` (Sport="Running"). Points are assigned to the lap whose
 * start time they follow; laps carry TotalTimeSeconds and DistanceMeters as given. Cadence is
 * written as the RunCadence extension.
 */
export function writeTcx(points: readonly TrackPoint[], laps: readonly DeviceLap[]): string {
  const first = points[0];
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<TrainingCenterDatabase xmlns="http://www.garmin.com/xmlschemas/TrainingCenterDatabase/v2" ' +
      'xmlns:ns3="http://www.garmin.com/xmlschemas/ActivityExtension/v2">',
    '<Activities><Activity Sport="Running">',
    `<Id>${first ? iso(first.t) : ''}</Id>`,
  ];
  let index = 0;
  laps.forEach((lap, k) => {
    const next = laps[k + 1];
    out.push(`<Lap StartTime="${iso(lap.start_t)}">`);
    if (lap.total_time_s !== null) out.push(`<TotalTimeSeconds>${lap.total_time_s}</TotalTimeSeconds>`);
    if (lap.distance_m !== null) out.push(`<DistanceMeters>${lap.distance_m}</DistanceMeters>`);
    out.push('<Intensity>Active</Intensity><TriggerMethod>Distance</TriggerMethod><Track>');
    while (index < points.length && (next === undefined || (points[index] as TrackPoint).t < next.start_t)) {
      const p = points[index++] as TrackPoint;
      let line = `<Trackpoint><Time>${iso(p.t)}</Time>`;
      if (p.lat !== undefined && p.lon !== undefined) {
        line += `<Position><LatitudeDegrees>${p.lat}</LatitudeDegrees><LongitudeDegrees>${p.lon}</LongitudeDegrees></Position>`;
      }
      if (p.ele !== undefined) line += `<AltitudeMeters>${p.ele}</AltitudeMeters>`;
      if (p.distance_m !== undefined) line += `<DistanceMeters>${p.distance_m}</DistanceMeters>`;
      if (p.hr !== undefined) line += `<HeartRateBpm><Value>${p.hr}</Value></HeartRateBpm>`;
      if (p.cad !== undefined)
        line += `<Extensions><ns3:TPX><ns3:RunCadence>${Math.round(p.cad / 2)}</ns3:RunCadence></ns3:TPX></Extensions>`;
      out.push(`${line}</Trackpoint>`);
    }
    out.push('</Track></Lap>');
  });
  out.push('</Activity></Activities>', '</TrainingCenterDatabase>', '');
  return out.join('\n');
}
