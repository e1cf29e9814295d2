/** Degrees to radians. */
const RAD = Math.PI / 180;

export interface RouteOutline {
  /** SVG polyline `points` attributes, one per stretch of known positions (gaps split the line). */
  lines: string[];
  /** First and last known position in SVG coordinates, or null without positions. */
  start: { x: number; y: number } | null;
  end: { x: number; y: number } | null;
}

/**
 * Projects a track onto a `width` × `height` box for an SVG outline: equirectangular, x = lon·cos(φ₀),
 * y = lat, with φ₀ the middle latitude, scaled uniformly to fit inside `padding`, centred, north up.
 * Points with a null or non-finite coordinate break the line. Fine for the few kilometres of a run;
 * not a map projection for large areas.
 */
export function projectRoute(
  lat: ReadonlyArray<number | null>,
  lon: ReadonlyArray<number | null>,
  width: number,
  height: number,
  padding = 8,
): RouteOutline {
  const known: Array<{ i: number; lat: number; lon: number }> = [];
  const n = Math.min(lat.length, lon.length);
  for (let i = 0; i < n; i++) {
    const la = lat[i];
    const lo = lon[i];
    if (la != null && lo != null && Number.isFinite(la) && Number.isFinite(lo)) known.push({ i, lat: la, lon: lo });
  }
  if (known.length === 0) return { lines: [], start: null, end: null };

  let minLat = Infinity;
  let maxLat = -Infinity;
  let minLon = Infinity;
  let maxLon = -Infinity;
  for (const p of known) {
    minLat = Math.min(minLat, p.lat);
    maxLat = Math.max(maxLat, p.lat);
    minLon = Math.min(minLon, p.lon);
    maxLon = Math.max(maxLon, p.lon);
  }
  const cosLat = Math.cos(((minLat + maxLat) / 2) * RAD);
  const spanX = (maxLon - minLon) * cosLat;
  const spanY = maxLat - minLat;
  const innerW = Math.max(0, width - 2 * padding);
  const innerH = Math.max(0, height - 2 * padding);
  const scale =
    spanX === 0 && spanY === 0 ? 0 : Math.min(spanX > 0 ? innerW / spanX : Infinity, spanY > 0 ? innerH / spanY : Infinity);
  const offsetX = (width - spanX * scale) / 2;
  const offsetY = (height - spanY * scale) / 2;
  const round = (v: number) => Math.round(v * 10) / 10;
  const toXY = (p: { lat: number; lon: number }) => ({
    x: round(offsetX + (p.lon - minLon) * cosLat * scale),
    y: round(offsetY + (maxLat - p.lat) * scale),
  });

  const lines: string[] = [];
  let current: string[] = [];
  let previousIndex = -2;
  for (const p of known) {
    if (p.i !== previousIndex + 1 && current.length > 0) {
      lines.push(current.join(' '));
      current = [];
    }
    const { x, y } = toXY(p);
    current.push(`${x},${y}`);
    previousIndex = p.i;
  }
  if (current.length > 0) lines.push(current.join(' '));
  return { lines, start: toXY(known[0]!), end: toXY(known[known.length - 1]!) };
}
