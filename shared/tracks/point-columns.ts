import type { TrackPoint } from './types.ts';

/** The numeric fields of a recorded point, in the order the columns are kept. */
export const POINT_FIELDS = ['t', 'lat', 'lon', 'ele', 'hr', 'cad', 'temp', 'distance_m'] as const;
export type PointField = (typeof POINT_FIELDS)[number];

/** Room for this many points is made at the first point unless the caller knows better. */
const DEFAULT_CAPACITY = 64;
const NO_VALUES = new Float64Array(0);
const NO_FLAGS = new Uint8Array(0);

/**
 * A first capacity for the points of one track in a document of `length` characters: one point
 * per 100 characters (a bare GPX point with a time is about 90, a device's 200–400). Room never
 * used costs address space, not memory (the system zero-fills pages when first touched), while
 * growing by doubling copies every column.
 */
export function pointCapacityFor(length: number): number {
  return Math.max(DEFAULT_CAPACITY, Math.ceil(length / 100));
}

/**
 * Recorded points as one growing Float64Array per field, NaN where a point has no value. A 1 s
 * file of 30 hours holds 108 000 points; kept as one object each (and again after cleaning) they
 * were most of the garbage collector's work during an import.
 */
export class PointColumns {
  length = 0;
  t = NO_VALUES;
  lat = NO_VALUES;
  lon = NO_VALUES;
  ele = NO_VALUES;
  hr = NO_VALUES;
  cad = NO_VALUES;
  temp = NO_VALUES;
  distance_m = NO_VALUES;
  /**
   * 1 when the file gave the point a latitude or a longitude, even an unreadable one: cleaning
   * counts those whose position it had to remove.
   */
  position_given = NO_FLAGS;
  /** Columns are only allocated at the first point, so a file of many empty tracks costs little. */
  private readonly firstCapacity: number;

  constructor(capacity = DEFAULT_CAPACITY) {
    this.firstCapacity = Math.max(1, capacity);
  }

  /** Make room for one more point and return its index; the caller sets every column there. */
  add(): number {
    const i = this.length;
    if (i === this.t.length) this.grow(i === 0 ? this.firstCapacity : i * 2);
    this.length = i + 1;
    return i;
  }

  /** Append a point; fields it does not have become NaN. Returns its index. */
  push(point: Readonly<TrackPoint>): number {
    const i = this.add();
    this.t[i] = point.t;
    this.lat[i] = point.lat ?? Number.NaN;
    this.lon[i] = point.lon ?? Number.NaN;
    this.ele[i] = point.ele ?? Number.NaN;
    this.hr[i] = point.hr ?? Number.NaN;
    this.cad[i] = point.cad ?? Number.NaN;
    this.temp[i] = point.temp ?? Number.NaN;
    this.distance_m[i] = point.distance_m ?? Number.NaN;
    this.position_given[i] = point.lat !== undefined || point.lon !== undefined ? 1 : 0;
    return i;
  }

  /** New columns holding the points at `indices`, in that order. */
  select(indices: Int32Array | readonly number[]): PointColumns {
    const n = indices.length;
    const out = new PointColumns(n);
    out.grow(n);
    for (const field of POINT_FIELDS) {
      const from = this[field];
      const to = out[field];
      for (let k = 0; k < n; k++) to[k] = from[indices[k] as number] as number;
    }
    for (let k = 0; k < n; k++) out.position_given[k] = this.position_given[indices[k] as number] as number;
    out.length = n;
    return out;
  }

  /** Point `i` as an object with only the fields it has (for tests and small consumers). */
  pointAt(i: number): TrackPoint {
    const point: TrackPoint = { t: this.t[i] as number };
    for (const field of POINT_FIELDS) {
      const value = this[field][i] as number;
      if (field !== 't' && !Number.isNaN(value)) point[field] = value;
    }
    return point;
  }

  /** A copy of one column, exactly `length` long. */
  column(field: PointField): Float64Array {
    return this[field].slice(0, this.length);
  }

  private grow(capacity: number): void {
    if (capacity <= this.t.length) return;
    for (const field of POINT_FIELDS) {
      const bigger = new Float64Array(capacity);
      bigger.set(this[field]);
      this[field] = bigger;
    }
    const given = new Uint8Array(capacity);
    given.set(this.position_given);
    this.position_given = given;
  }
}
