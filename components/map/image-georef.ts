/** Where a preview image lies on the ground: image pixel <-> WGS 84 longitude/latitude. */
import proj4 from 'proj4';
import { mapToPixel, pixelToMap, type GeoTransform } from '../../terrain/grid';

/** An image placed on the ground; pixel coordinates are corner-based (0, 0 is the outer top-left corner). */
export interface ImageGeoref {
  widthPx: number;
  heightPx: number;
  /** Longitude and latitude (degrees, WGS 84) of an image point. */
  toLonLat(xPx: number, yPx: number): [number, number];
  /** Image point of a longitude/latitude; may lie outside the image. */
  toPixel(lon: number, lat: number): [number, number];
}

const WGS84_PROJ4 = '+proj=longlat +datum=WGS84 +no_defs';

function checkSize(widthPx: number, heightPx: number): void {
  if (!(Number.isInteger(widthPx) && widthPx > 0 && Number.isInteger(heightPx) && heightPx > 0)) {
    throw new RangeError(`image size must be whole pixels > 0, got ${widthPx} x ${heightPx}.`);
  }
}

/**
 * Georeference of an image whose pixels follow a GDAL geotransform in the grid's CRS (as the site's hillshade
 * record gives it), converted to WGS 84 with proj4. This is the client's only proj4 use.
 */
export function projectedGeoref(widthPx: number, heightPx: number, transform: GeoTransform, crsProj4: string): ImageGeoref {
  checkSize(widthPx, heightPx);
  const conv = proj4(WGS84_PROJ4, crsProj4);
  return {
    widthPx,
    heightPx,
    toLonLat(xPx, yPx) {
      const [x, y] = pixelToMap(transform, xPx, yPx);
      const r = conv.inverse([x, y]);
      return [r[0], r[1]];
    },
    toPixel(lon, lat) {
      const r = conv.forward([lon, lat]);
      return mapToPixel(transform, r[0], r[1]);
    },
  };
}

/** Georeference of a north-up image spread linearly over WGS 84 bounds [minLon, minLat, maxLon, maxLat]. */
export function boundsGeoref(widthPx: number, heightPx: number, boundsWgs84: readonly [number, number, number, number]): ImageGeoref {
  checkSize(widthPx, heightPx);
  const [minLon, minLat, maxLon, maxLat] = boundsWgs84;
  if (!(maxLon > minLon && maxLat > minLat)) throw new RangeError(`bounds must be [minLon, minLat, maxLon, maxLat] with max > min, got ${JSON.stringify(boundsWgs84)}.`);
  const sx = (maxLon - minLon) / widthPx;
  const sy = (maxLat - minLat) / heightPx;
  return {
    widthPx,
    heightPx,
    toLonLat: (xPx, yPx) => [minLon + xPx * sx, maxLat - yPx * sy],
    toPixel: (lon, lat) => [(lon - minLon) / sx, (maxLat - lat) / sy],
  };
}

/** The hillshade part of a site record: image size, WGS 84 bounds and, where known, the grid-CRS transform. */
interface HillshadePlacement {
  width: number;
  height: number;
  boundsWgs84: [number, number, number, number];
  transform?: readonly number[];
}

/**
 * The georeference of a site's hillshade: the exact transform when the record has one, else its WGS 84 bounds.
 * A CRS whose datum shift is an NTv2 grid file (+nadgrids=BETA2007.gsb) uses the bounds too: the browser has no
 * grid files, and the server computed the bounds with the grid.
 */
export function hillshadeGeoref(h: HillshadePlacement, crsProj4: string | null | undefined): ImageGeoref {
  if (h.transform && h.transform.length === 6 && crsProj4 && !/\+nadgrids=(?!@null\b)/.test(crsProj4)) {
    return projectedGeoref(h.width, h.height, h.transform as unknown as GeoTransform, crsProj4);
  }
  return boundsGeoref(h.width, h.height, h.boundsWgs84);
}

/** Whether an image point lies on the image (edges included). */
export function onImage(g: Pick<ImageGeoref, 'widthPx' | 'heightPx'>, [xPx, yPx]: readonly [number, number]): boolean {
  return xPx >= 0 && yPx >= 0 && xPx <= g.widthPx && yPx <= g.heightPx;
}
