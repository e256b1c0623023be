/** Where a live coverage document's map images lie on the site's hillshade, as map layers (views coloured, short passed ground hatched). */
import type { LiveCoverage } from '../../contracts/live-coverage';
import type { MapImageLayer } from '../map/map-shapes';
import { rasterRect } from './coverage-placement';

/** Pure: the layers of a document, or none when it has no map or the hillshade cannot place it. */
export function liveLayersOf(doc: LiveCoverage | null, hillshadeTransform: readonly number[] | null | undefined): MapImageLayer[] {
  const m = doc?.map;
  if (!m) return [];
  const rect = rasterRect(m.geotransform, m.width, m.height, hillshadeTransform);
  if (!rect) return [];
  return [
    { kind: 'image', href: `data:image/png;base64,${m.viewsPngBase64}`, rect, opacity: 0.85, testID: 'live-layer-views' },
    { kind: 'hatch', href: `data:image/png;base64,${m.shortPngBase64}`, rect, testID: 'live-layer-short' },
  ];
}
