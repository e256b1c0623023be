/**
 * "Ground proof": the client's spec checked in every cell of the survey area, not only at photo centres. The share
 * of area meeting each item, a map layer per measure with the cells short of the spec hatched, a tapped cell's
 * figures, the largest shortfalls with their reasons, and the raster to download.
 */
import { StyleSheet, View } from 'react-native';
import type { HillshadeInfo } from '../../contracts/sites';
import type { CoverageMeasure } from '../../terrain/coverage-measures';
import { errorMessage } from '../api/api-error';
import type { ImageGeoref } from '../map/image-georef';
import { MapCanvas } from '../map/map-canvas';
import type { MapShape } from '../map/map-shapes';
import { DownloadLink } from '../reports/download-link';
import { colors, layout, radii, space } from '../theme';
import { Banner, Button, Card, ChoiceGroup, Heading, List, Loading, Text } from '../ui';
import { CoverageLegend } from './coverage-legend';
import { areaWords, basisWords, itemTitle, shareWords, specWords } from '../../contracts/coverage-words';
import { useCoverageView } from './use-coverage-view';

type CoverageCardProps = {
  teamId: string | undefined;
  planId: string;
  versionId: string;
  georef: ImageGeoref;
  hillshade: HillshadeInfo;
  hillshadeUrl: string;
  baseShapes: MapShape[];
  view: readonly [number, number, number, number];
};

const measureChoices: { value: CoverageMeasure; label: string }[] = [
  { value: 'gsd', label: 'GSD' },
  { value: 'views', label: 'Views' },
  { value: 'sigma', label: 'Vertical σ' },
];

/** How many shortfalls the card lists (largest first); the raster holds them all. */
const listedPatches = 5;

export function CoverageCard(props: CoverageCardProps) {
  const v = useCoverageView(props);
  const { coverage, ready } = v;
  return (
    <Card testID="coverage-card">
      <Heading level={2}>Ground proof</Heading>
      {coverage.isPending ? <Loading label="Loading the coverage of every ground cell…" /> : null}
      {coverage.isError ? <Banner tone="danger" title="Could not load the coverage" message={errorMessage(coverage.error)} /> : null}
      {coverage.data?.state === 'refused' ? <Banner tone="caution" title="No coverage for this version" message={coverage.data.reason} testID="coverage-refused" /> : null}
      {coverage.data?.state === 'none' ? <Banner tone="info" title="No coverage for this version" message={coverage.data.reason} testID="coverage-none" /> : null}
      {ready ? (
        <>
          <Text testID="coverage-spec">
            Spec: {specWords(ready.document.spec)} ({ready.document.raster.cellM} m cells, {areaWords(ready.document.compliance.areaM2)}).
          </Text>
          <Text variant="caption" tone="muted" testID="coverage-basis">
            {basisWords(ready.document.envelope)}
          </Text>
          <List label="Share of the area meeting each item of the spec" style={styles.items} testID="coverage-items">
            {ready.document.compliance.items.map((it) => (
              <View key={it.item} style={styles.item} testID={`coverage-item-${it.item}`}>
                <View style={styles.itemHead}>
                  <Text variant="bodyStrong">{itemTitle(it.item, ready.document.spec)}</Text>
                  <Text variant="label" tone={it.share < 1 ? 'caution' : 'success'}>
                    {shareWords(it.share)} of the area{it.failingAreaM2 > 0 ? ` · ${areaWords(it.failingAreaM2)} short` : ' · met everywhere'}
                  </Text>
                </View>
                <View style={styles.bar} aria-hidden>
                  <View style={[styles.barFill, { width: `${Math.round(it.share * 1000) / 10}%` }]} />
                </View>
              </View>
            ))}
          </List>
          <Text variant="bodyStrong" testID="coverage-all">
            Every item met on {shareWords(ready.document.compliance.shareAll)} of the area.
          </Text>
          <ChoiceGroup label="Colour the map by" choices={measureChoices} value={v.measure} onChange={v.setMeasure} testID="coverage-measure" />
          {v.placed ? (
            <MapCanvas
              imageUrl={props.hillshadeUrl}
              widthPx={props.georef.widthPx}
              heightPx={props.georef.heightPx}
              shapes={v.shapes}
              layers={v.layers}
              view={props.view}
              georef={props.georef}
              onTap={v.onMapTap}
              crosshair
              label={`Coverage map coloured by ${v.layer?.label ?? v.measure}; cells short of the spec are hatched. Tap a point to read its cell's figures.`}
              testID="coverage-map"
            />
          ) : (
            <Banner tone="info" message="This site's preview has no geotransform, so the coverage cannot be placed on it; the figures and the raster download are complete." />
          )}
          {v.layer ? <CoverageLegend layer={v.layer} /> : null}
          <CellFigures v={v} />
          <Heading level={3}>Largest shortfalls</Heading>
          {ready.document.patchCount === 0 ? (
            <Text testID="coverage-no-patches">No cell falls short of the spec.</Text>
          ) : (
            <List label="Largest patches of ground short of the spec" style={styles.patches} testID="coverage-patches">
              {ready.document.patches.slice(0, listedPatches).map((p, i) => (
                <View key={`${p.centroid.lon},${p.centroid.lat},${p.reason}`} style={styles.patch} testID={`coverage-patch-${i}`}>
                  <View style={styles.itemWords}>
                    <Text variant="bodyStrong">{areaWords(p.areaM2)}: {p.message}</Text>
                    <Text variant="caption" tone="muted">
                      Centre {p.centroid.lat.toFixed(5)}, {p.centroid.lon.toFixed(5)} (WGS 84)
                    </Text>
                  </View>
                  <Button label="Show on the map" variant="secondary" onPress={() => v.showAt(p.centroid.lon, p.centroid.lat)} testID={`coverage-patch-${i}-show`} />
                </View>
              ))}
            </List>
          )}
          {ready.document.patchCount > listedPatches ? (
            <Text variant="caption" tone="muted">
              {ready.document.patchCount - listedPatches} smaller patches are in the raster (band 1 views, band 2 finest GSD).
            </Text>
          ) : null}
          <DownloadLink href={ready.rasterUrl} label="Download the coverage raster" detail="Cloud-Optimised GeoTIFF, 5 bands: views, finest GSD, views at the spec GSD, largest ray angle, vertical σ" testID="coverage-download" />
          <Text variant="caption" tone="muted">{ready.document.precision}</Text>
        </>
      ) : null}
    </Card>
  );
}

function CellFigures({ v }: { v: ReturnType<typeof useCoverageView> }) {
  if (!v.tapped) return <Text variant="caption" tone="muted">Tap the map to read one cell&apos;s figures.</Text>;
  const at = `${v.tapped.lat.toFixed(5)}, ${v.tapped.lon.toFixed(5)}`;
  if (v.cell.isPending) return <Loading label={`Reading the cell at ${at}…`} />;
  if (v.cell.isError) return <Banner tone="danger" title="Could not read the cell" message={errorMessage(v.cell.error)} />;
  const c = v.cell.data;
  if (!c || !c.inside) return <Text testID="coverage-cell">At {at}: outside the survey area.</Text>;
  // each unit with its own spacing, as contracts/format/figures.ts writes them: the degree sign straight after its
  // number, every other unit after a space (SI Brochure, 9th edition, 5.4.3)
  const n = (x: number | null, d: number, unit: string) => (x === null ? 'none' : `${x.toFixed(d)}${unit}`);
  return (
    <View style={styles.cell} testID="coverage-cell" aria-live="polite">
      <Text variant="bodyStrong">Cell at {at} (WGS 84)</Text>
      <Text>
        {c.views} views · finest GSD {n(c.finestGsdCm, 2, ' cm')} · {c.viewsAtSpecGsd ?? 0} views at the spec GSD · widest ray angle {n(c.maxRayAngleDeg, 1, '°')} · vertical σ {n(c.sigmaVerticalM, 3, ' m')} (advisory)
      </Text>
      <Text tone={c.fails.length ? 'caution' : 'success'}>{c.fails.length ? `Short of the spec: ${c.fails.join('; ')}.` : 'Meets every item of the spec.'}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  items: { gap: space.md },
  item: { gap: space.xs },
  // above its bar, in a column: no flex basis, which would set the words' height there, not their width
  itemHead: { gap: space.xxs, minWidth: 0 },
  itemWords: { flexGrow: 1, flexShrink: 1, flexBasis: 220, gap: space.xxs, minWidth: 0 },
  bar: { height: space.sm, borderRadius: radii.pill, backgroundColor: colors.cautionSoft, borderWidth: layout.borderWidthPx, borderColor: colors.line, overflow: 'hidden' },
  barFill: { height: '100%', backgroundColor: colors.primary },
  patches: { gap: space.sm },
  patch: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm, paddingVertical: space.xs, borderTopWidth: layout.borderWidthPx, borderTopColor: colors.line },
  cell: { gap: space.xxs, padding: space.md, borderRadius: radii.md, backgroundColor: colors.surfaceSunken },
});
