/** Types for tokml 0.4 (GeoJSON -> KML string), which ships none. */
declare module 'tokml' {
  import type { FeatureCollection, Feature } from 'geojson';
  interface TokmlOptions {
    documentName?: string;
    documentDescription?: string;
    /** Property holding each placemark's name / description. */
    name?: string;
    description?: string;
    timestamp?: string;
    simplestyle?: boolean;
  }
  export default function tokml(geojson: FeatureCollection | Feature, options?: TokmlOptions): string;
}
