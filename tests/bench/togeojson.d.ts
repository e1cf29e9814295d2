declare module '@mapbox/togeojson' {
  import type { FeatureCollection } from 'geojson';
  const togeojson: { gpx(doc: Document): FeatureCollection };
  export default togeojson;
}
