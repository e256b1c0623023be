/** State of the coverage card: which measure the map colours, the tapped point and its cell, the map layers. */
import { useMemo, useState } from 'react';
import type { CoverageMeasure } from '../../terrain/coverage-measures';
import type { HillshadeInfo } from '../../contracts/sites';
import type { ImageGeoref } from '../map/image-georef';
import type { MapImageLayer, MapShape } from '../map/map-shapes';
import { colors } from '../theme';
import { useCoverageCell, useVersionCoverage } from './coverage.queries';
import { rasterRect } from './coverage-placement';

interface CoverageViewArgs {
  teamId: string | undefined;
  planId: string;
  versionId: string;
  georef: ImageGeoref;
  hillshade: HillshadeInfo;
  /** The overview's shapes (area, lines), drawn over the layer. */
  baseShapes: MapShape[];
}

export function useCoverageView({ teamId, planId, versionId, georef, hillshade, baseShapes }: CoverageViewArgs) {
  const coverage = useVersionCoverage(teamId, planId, versionId, true);
  const [measure, setMeasure] = useState<CoverageMeasure>('gsd');
  const [tapped, setTapped] = useState<{ lon: number; lat: number; px: [number, number] } | null>(null);
  const cell = useCoverageCell(teamId, planId, versionId, tapped);
  const ready = coverage.data?.state === 'ready' ? coverage.data : null;
  const rect = useMemo(
    () => (ready ? rasterRect(ready.document.raster.geotransform, ready.document.raster.width, ready.document.raster.height, hillshade.transform) : null),
    [ready, hillshade.transform],
  );
  const layer = ready?.layers.find((l) => l.measure === measure) ?? null;
  const layers: MapImageLayer[] = useMemo(() => {
    if (!ready || !rect || !layer) return [];
    return [
      { kind: 'image', href: layer.imageUrl, rect, opacity: 0.85, testID: 'coverage-layer-image' },
      { kind: 'hatch', href: ready.failingImageUrl, rect, testID: 'coverage-layer-hatch' },
    ];
  }, [ready, rect, layer]);
  const shapes: MapShape[] = useMemo(() => {
    const lines = baseShapes.filter((s) => s.kind === 'polygon'); // the area's outline; lines and markers would hide the cells
    if (!tapped) return lines;
    return [...lines, { kind: 'marker', id: 'tapped-cell', at: tapped.px, shape: 'cross', fill: colors.ink, stroke: colors.surface, sizePx: 16 }];
  }, [baseShapes, tapped]);
  const onMapTap = (xPx: number, yPx: number) => {
    const [lon, lat] = georef.toLonLat(xPx, yPx);
    setTapped({ lon, lat, px: [xPx, yPx] });
  };
  /** Put the cross on a patch's centre (from the shortfall list) and read its cell. */
  const showAt = (lon: number, lat: number) => setTapped({ lon, lat, px: georef.toPixel(lon, lat) as [number, number] });
  return { coverage, ready, measure, setMeasure, layer, layers, shapes, onMapTap, tapped, cell, showAt, placed: rect !== null };
}
