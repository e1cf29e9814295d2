/**
 * The benchmark's baseline: the import built the usual way from general-purpose packages, doing
 * the same job as `parseTrackFile` + `analyseTrack` for distance and splits. The whole document
 * becomes an @xmldom/xmldom DOM; GPX goes through @mapbox/togeojson to coordinates and times
 * (togeojson 0.16 reads GPX and KML only, so TCX trackpoints are read from the same DOM with
 * `getElementsByTagName`); geolib's ellipsoidal (Vincenty) distance gives the distance between
 * neighbouring points, and splits per mile and per km are interpolated on the cumulative
 * distance.
 *
 * togeojson is CommonJS without named exports under Node ESM: take the default export.
 */
import togeojson from '@mapbox/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import { getPreciseDistance } from 'geolib';
import type { Position } from 'geojson';

export interface BaselineTrack {
  lat: number[];
  lon: number[];
  /** ms since the epoch */
  t: number[];
}

export interface BaselineSplit {
  index: number;
  distance_m: number;
  elapsed_s: number;
}

export interface BaselineAnalysis {
  distance_m: number;
  splits: { mi: BaselineSplit[]; km: BaselineSplit[] };
}

const METRES_PER_MILE = 1609.344;
const METRES_PER_KM = 1000;

function parseDocument(xml: string): Document {
  return new DOMParser().parseFromString(xml, 'text/xml') as unknown as Document;
}

function childText(parent: Element, name: string): string | null {
  return parent.getElementsByTagName(name)[0]?.textContent ?? null;
}

/** Coordinates and times of every track point, via xmldom (+ togeojson for GPX). */
export function readBaselineTrack(xml: string, format: 'gpx' | 'tcx'): BaselineTrack {
  const doc = parseDocument(xml);
  const track: BaselineTrack = { lat: [], lon: [], t: [] };
  if (format === 'tcx') {
    const points = doc.getElementsByTagName('Trackpoint');
    for (let i = 0; i < points.length; i++) {
      const point = points[i] as Element;
      const lat = childText(point, 'LatitudeDegrees');
      const lon = childText(point, 'LongitudeDegrees');
      const time = childText(point, 'Time');
      if (lat === null || lon === null || time === null) continue;
      track.lat.push(Number(lat));
      track.lon.push(Number(lon));
      track.t.push(Date.parse(time));
    }
    return track;
  }
  for (const feature of togeojson.gpx(doc).features) {
    const { geometry } = feature;
    const lines: Position[][] =
      geometry.type === 'LineString' ? [geometry.coordinates] : geometry.type === 'MultiLineString' ? geometry.coordinates : [];
    const rawTimes = (feature.properties?.coordTimes ?? []) as string[] | string[][];
    const times: string[][] = lines.length === 1 ? [rawTimes as string[]] : (rawTimes as string[][]);
    lines.forEach((line, l) => {
      line.forEach((position, i) => {
        const time = times[l]?.[i];
        if (time === undefined) return;
        track.lon.push(position[0] as number);
        track.lat.push(position[1] as number);
        track.t.push(Date.parse(time));
      });
    });
  }
  return track;
}

function splitsOf(cumulative: readonly number[], t: readonly number[], unitM: number): BaselineSplit[] {
  const n = cumulative.length;
  const total = cumulative[n - 1] ?? 0;
  const splits: BaselineSplit[] = [];
  let startT = t[0] ?? 0;
  let i = 1;
  for (let k = 1; k * unitM <= total; k++) {
    const boundary = k * unitM;
    while ((cumulative[i] as number) < boundary) i++;
    const d0 = cumulative[i - 1] as number;
    const t0 = t[i - 1] as number;
    const endT = t0 + ((boundary - d0) / ((cumulative[i] as number) - d0)) * ((t[i] as number) - t0);
    splits.push({ index: k, distance_m: unitM, elapsed_s: (endT - startT) / 1000 });
    startT = endT;
  }
  const rest = total - splits.length * unitM;
  if (rest >= 1) splits.push({ index: splits.length + 1, distance_m: rest, elapsed_s: ((t[n - 1] as number) - startT) / 1000 });
  return splits;
}

/** Distance (geolib, 1 cm resolution) and splits per mile and per km. */
export function analyseBaselineTrack(track: BaselineTrack): BaselineAnalysis {
  const n = track.t.length;
  const cumulative = new Array<number>(n);
  let sum = 0;
  if (n > 0) cumulative[0] = 0;
  for (let i = 1; i < n; i++) {
    sum += getPreciseDistance(
      { latitude: track.lat[i - 1] as number, longitude: track.lon[i - 1] as number },
      { latitude: track.lat[i] as number, longitude: track.lon[i] as number },
      0.01,
    );
    cumulative[i] = sum;
  }
  return {
    distance_m: sum,
    splits: { mi: splitsOf(cumulative, track.t, METRES_PER_MILE), km: splitsOf(cumulative, track.t, METRES_PER_KM) },
  };
}
