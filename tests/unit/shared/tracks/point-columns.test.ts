import { describe, expect, it } from 'vitest';
import { cleanPoints, cleanTrack } from '../../../../shared/tracks/clean.ts';
import { PointColumns, pointCapacityFor } from '../../../../shared/tracks/point-columns.ts';
import { buildSeries, seriesPositions } from '../../../../shared/tracks/series.ts';
import type { TrackPoint } from '../../../../shared/tracks/types.ts';
import { T0 } from './helpers.ts';

const at = (s: number, extra: Partial<TrackPoint> = {}): TrackPoint => ({ t: T0 + s * 1000, lat: 45, lon: 7, ...extra });

const columnsOf = (points: readonly TrackPoint[], capacity?: number): PointColumns => {
  const columns = new PointColumns(capacity);
  for (const point of points) columns.push(point);
  return columns;
};

describe('PointColumns', () => {
  it('gives back each point with only the fields it has, past its first capacity', () => {
    const points: TrackPoint[] = Array.from({ length: 10 }, (_, i) =>
      i % 2 === 0 ? { t: T0 + i * 1000, lat: 45 + i / 1000, lon: 7, hr: 120 + i } : { t: T0 + i * 1000, distance_m: i * 3 },
    );
    const columns = columnsOf(points, 3);
    expect(columns.length).toBe(10);
    expect(Array.from({ length: 10 }, (_, i) => columns.pointAt(i))).toEqual(points);
    expect(columns.column('hr')).toHaveLength(10);
    expect(Number.isNaN(columns.column('hr')[1]!)).toBe(true);
  });

  it('remembers a position that was given even when it cannot be read', () => {
    const columns = columnsOf([
      { t: T0, lat: Number.NaN, lon: 7 },
      { t: T0 + 1000, distance_m: 1 },
    ]);
    expect([...columns.position_given.subarray(0, 2)]).toEqual([1, 0]);
  });

  it('selects points by index, in the order given', () => {
    const columns = columnsOf([{ t: T0 }, { t: T0 + 1000, ele: 5 }, { t: T0 + 2000, ele: 6 }]);
    const picked = columns.select([2, 0]);
    expect(picked.length).toBe(2);
    expect([picked.pointAt(0), picked.pointAt(1)]).toEqual([{ t: T0 + 2000, ele: 6 }, { t: T0 }]);
  });

  it('allocates nothing for a track without points', () => {
    const empty = new PointColumns(1_000_000);
    expect(empty.t.length).toBe(0);
    expect(empty.column('t')).toHaveLength(0);
  });

  it.each([
    [0, 64],
    [6_400, 64],
    [25_000_000, 250_000],
  ])('plans room for a document of %i characters: %i points', (length, capacity) => {
    expect(pointCapacityFor(length)).toBe(capacity);
  });
});

describe('cleanPoints', () => {
  it('cleans columns with segment starts as cleanTrack cleans the same segments, empty segments included', () => {
    const segments = [[at(0), at(1, { hr: 300 })], [], [at(1), at(5, { lat: 95 })], [at(6), at(6, { ele: 3 })]];
    const starts = [0, 2, 2, 4];
    const fromColumns = cleanPoints(columnsOf(segments.flat()), starts);
    const fromSegments = cleanTrack(segments);
    expect(fromColumns.points).toEqual(fromSegments.points);
    expect(fromColumns.segment_starts).toEqual([0, 2]);
    expect(fromColumns.report).toEqual({
      input_points: 6,
      dropped_untimed: 0,
      dropped_backwards: 0,
      merged_duplicates: 2,
      dropped_no_position: 1,
      invalid_positions: 1,
    });
  });

  it('builds the point objects only when they are asked for', () => {
    const track = cleanPoints(columnsOf([at(0), at(1)]), [0]);
    expect(track.columns.length).toBe(2);
    expect(track.points).toBe(track.points);
    expect(track.points).toEqual([
      { t: T0, lat: 45, lon: 7 },
      { t: T0 + 1000, lat: 45, lon: 7 },
    ]);
  });
});

describe('seriesPositions', () => {
  it('leaves out the points without position when the distance is geodesic', () => {
    const track = cleanTrack([[at(0), { t: T0 + 1000, distance_m: 4 }, at(2, { lat: 45.0001 })]]);
    const series = buildSeries(track);
    expect(series.distance_source).toBe('geodesic');
    const { lat, lon } = seriesPositions(track, series);
    expect([...lat]).toEqual([45, 45.0001]);
    expect([...lon]).toEqual([7, 7]);
  });

  it('keeps every point, NaN where there is no position, when the distance is the device’s', () => {
    const track = cleanTrack([
      [
        { t: T0, distance_m: 0, lat: 45, lon: 7 },
        { t: T0 + 1000, distance_m: 4 },
      ],
    ]);
    const series = buildSeries(track);
    expect(series.distance_source).toBe('device');
    const { lat } = seriesPositions(track, series);
    expect(lat).toHaveLength(2);
    expect(lat[0]).toBe(45);
    expect(Number.isNaN(lat[1]!)).toBe(true);
  });
});
