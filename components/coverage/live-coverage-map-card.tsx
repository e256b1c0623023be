/** On the version's page while it is flown: the coverage as flown so far on the map, passed ground short of the spec hatched. */
import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { HillshadeInfo } from '../../contracts/sites';
import { liveViewOf, useLiveCoverage } from '../flights/use-live-coverage';
import type { ImageGeoref } from '../map/image-georef';
import { MapCanvas } from '../map/map-canvas';
import type { MapShape } from '../map/map-shapes';
import { BulletList } from '../reports/bullet-list';
import { space } from '../theme';
import { Banner, Card, Heading, Loading, Text } from '../ui';
import { liveLayersOf } from './live-coverage-layers';

type LiveCoverageMapCardProps = {
  teamId: string | undefined;
  versionId: string;
  hillshade: HillshadeInfo;
  hillshadeUrl: string;
  georef: ImageGeoref;
  baseShapes: MapShape[];
  view: readonly [number, number, number, number];
  units: UnitSystem;
};

/** testIDs live-map-card, live-map-headline, live-map, live-map-patches. Shown for signed-off versions only. */
export function LiveCoverageMapCard(p: LiveCoverageMapCardProps) {
  const { live: s } = useLiveCoverage(p.teamId, p.versionId, true, false, { map: true });
  const doc = s.kind === 'live' ? s.doc : null;
  const layers = useMemo(() => liveLayersOf(doc, p.hillshade.transform), [doc, p.hillshade.transform]);
  const outline = useMemo(() => p.baseShapes.filter((x) => x.kind === 'polygon'), [p.baseShapes]);
  const v = doc ? liveViewOf(doc, p.units) : null;
  return (
    <Card testID="live-map-card">
      <Heading level={2}>Live coverage as flown</Heading>
      {s.kind === 'unavailable' ? <Text tone="muted">{s.reason}</Text> : null}
      {s.kind === 'waiting' ? <Loading label="Connecting to the live coverage…" /> : null}
      {v ? (
        <View style={styles.body}>
          <Text testID="live-map-headline">{v.headline}</Text>
          {v.refused ? <Banner tone="danger" title="Live coverage not computed" message={v.refused} /> : null}
          {layers.length ? (
            <>
              <MapCanvas
                imageUrl={p.hillshadeUrl}
                widthPx={p.georef.widthPx}
                heightPx={p.georef.heightPx}
                shapes={outline}
                layers={layers}
                view={p.view}
                georef={p.georef}
                label={`Coverage as flown so far, coloured by the number of views (lighter is more, up to ${doc?.map?.viewsMax ?? 0}); ground already passed that falls short of the spec is hatched.`}
                testID="live-map"
              />
              <Text variant="caption" tone="muted">
                Colour: views from the photos so far (lighter is more, {doc?.map?.viewsMax ?? 0} or more at the light end). Hatched: ground the aircraft has passed that falls short of the spec.
              </Text>
            </>
          ) : null}
          {v.patches.length ? (
            <Banner tone="caution" title="Passed but short of the spec: re-fly before landing" testID="live-map-patches">
              <BulletList items={v.patches} tone="caution" />
            </Banner>
          ) : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({ body: { gap: space.md } });
