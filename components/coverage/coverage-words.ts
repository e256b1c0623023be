/** The coverage document in words and placements for the screens: the spec, each item, areas, and where the raster lies on the hillshade. */
import type { CoverageDocument } from '../../contracts/coverage';
import { mapToPixel, type GeoTransform } from '../../terrain/grid';

type Item = CoverageDocument['compliance']['items'][number];

/** "≤ 2.5 cm GSD and ≥ 5 views in every cell", plus σ limits where the spec has them. */
export function specWords(spec: CoverageDocument['spec']): string {
  const parts = [`GSD ≤ ${spec.maxGsdCm} cm`, `≥ ${spec.minViews} views`];
  if (spec.maxSigmaVerticalM !== null) parts.push(`vertical σ ≤ ${spec.maxSigmaVerticalM} m`);
  if (spec.maxSigmaHorizontalM !== null) parts.push(`horizontal σ ≤ ${spec.maxSigmaHorizontalM} m`);
  return `${parts.join(', ')} in every cell`;
}

/** How views were counted: under the attitude envelope (its figures) or at the planned attitude. */
export function basisWords(envelope: CoverageDocument['envelope']): string {
  if (!envelope) return 'Views counted at the planned attitude (the mission states no attitude envelope).';
  const wind = envelope.windMps > 0 ? `, wind ${envelope.windMps} m/s from ${envelope.windFromDeg}°${envelope.crabs ? ' (the aircraft crabs into it)' : ''}` : '';
  return `Guaranteed: a view counts only if the point stays in the photo at every attitude within ±${envelope.rollDeg}° roll and ±${envelope.pitchDeg}° pitch${wind}.`;
}

/** What an item asks, as a short title. */
export function itemTitle(item: Item['item'], spec: CoverageDocument['spec']): string {
  switch (item) {
    case 'gsd': return `Fine enough: a view at GSD ≤ ${spec.maxGsdCm} cm`;
    case 'views': return `Seen often enough: ≥ ${spec.minViews} views`;
    case 'sigma-vertical': return `Vertical σ ≤ ${spec.maxSigmaVerticalM} m (advisory)`;
    case 'sigma-horizontal': return `Horizontal σ ≤ ${spec.maxSigmaHorizontalM} m (advisory)`;
    case 'ground-unknown': return 'Ground height known';
  }
}

/** 1234 m² → "1,234 m²"; 56,789 m² → "5.68 ha". */
export function areaWords(m2: number): string {
  if (m2 >= 10_000) return `${(m2 / 10_000).toFixed(2)} ha`;
  return `${Math.round(m2).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ',')} m²`;
}

/** 0.684638 → "68.5 %" (never "100 %" unless every cell meets it). */
export function shareWords(share: number): string {
  const pct = share * 100;
  if (share < 1 && pct > 99.9) return '> 99.9 %';
  if (share > 0 && pct < 0.1) return '< 0.1 %';
  return `${pct.toFixed(1)} %`;
}

/**
 * Where the raster lies on the hillshade image, [x, y, width, height] in image pixels: both geotransforms are in
 * the grid's CRS, so the corners map linearly. Null when the hillshade has no geotransform (older sites).
 */
export function rasterRect(rasterTransform: readonly number[], width: number, height: number, hillshadeTransform: readonly number[] | null | undefined): [number, number, number, number] | null {
  if (!hillshadeTransform || hillshadeTransform.length !== 6) return null;
  const hs = hillshadeTransform as unknown as GeoTransform;
  const t = rasterTransform;
  const [x0, y0] = mapToPixel(hs, t[0], t[3]);
  const [x1, y1] = mapToPixel(hs, t[0] + width * t[1], t[3] + height * t[5]);
  return [Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0)];
}
