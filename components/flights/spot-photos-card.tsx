/**
 * One tour of spot photos on the leg sheet: how many, where in the flight, and for each its position and the heights
 * a pilot checks, each naming its reference (above takeoff, above the datum, above ground).
 */
import { StyleSheet, View } from 'react-native';
import type { SheetBlock } from './sheet-blocks';
import type { UnitSystem } from '../../contracts/projects';
import { formatCount } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { colors, layout, space } from '../theme';
import { Card, Heading, List, Text } from '../ui';
import { formatAltitudePair, formatDatumPair, formatGsdRange, formatLatLon, formatRange } from './leg-format';
import { lineAnchorId } from './line-index';
import { lineRunWords, tourPlaceWords } from './sheet-blocks';

type Props = { block: Extract<SheetBlock, { kind: 'spots' }>; units: UnitSystem; datumName: string; tiltedLines: boolean };

/** testIDs: spot-photos-N (N the first spot's line number), spot-photos-N-count, spot-M for each spot (M its line number). */
export function SpotPhotosCard({ block, units, datumName, tiltedLines }: Props) {
  const first = block.spots[0]!.number;
  const n = block.spots.length;
  const id = `spot-photos-${first}`;
  return (
    <View nativeID={lineAnchorId(first)}>
      <Card testID={id}>
        <Heading level={2} testID={`${id}-count`}>
          {formatCount(n)} spot {n === 1 ? 'photo' : 'photos'}
        </Heading>
        <Text variant="bodyStrong">
          {lineRunWords(block.spots)} of the plan · one tour, {tourPlaceWords(block)}
        </Text>
        <Text>
          Ground the lines see too coarsely gets one photo from straight above. At each spot the aircraft stops over the
          point at the altitude given, takes one photo with the camera straight down and flies on to the next at the
          higher of the two altitudes (climbing before it leaves, or descending once it is over the next).
        </Text>
        {tiltedLines ? (
          <Text variant="bodyStrong" tone="caution" testID={`${id}-camera`}>
            Camera straight down for these photos, not tilted as on the lines: the mission items set it; flying from
            waypoints alone, set it before the first spot.
          </Text>
        ) : null}
        <List label="Spot photos" style={styles.list} itemStyle={styles.item}>
          {block.spots.map((s, i) => {
            const leg = s.legs[0];
            return (
              <View key={s.number} style={styles.spot} testID={`spot-${s.number}`} role="group" aria-label={`Spot ${i + 1}, line ${s.number}`}>
                <Text variant="label" tone="muted">
                  Spot {i + 1} · line {s.number} · {formatLatLon(s.start)}
                </Text>
                {leg ? (
                  <>
                    <Text variant="title" testID={`spot-${s.number}-altitude`}>
                      {formatAltitudePair(leg.altitudeAboveTakeoffM, units)} above takeoff
                    </Text>
                    <Text testID={`spot-${s.number}-heights`}>
                      {formatDatumPair(leg.altitudeAboveDatumM, units)} above {datumName} · {formatRange(leg.aglM, units)} above ground · GSD{' '}
                      {formatGsdRange(leg.gsdCm)}
                    </Text>
                  </>
                ) : (
                  <Text tone="caution">No altitude: the grid has no ground here.</Text>
                )}
                {s.cameraTiltDeg ? (
                  <Text variant="bodyStrong" tone="caution">
                    Camera tilted {s.cameraTiltDeg}° from straight down towards the nose.
                  </Text>
                ) : null}
                {s.warnings.length ? <BulletList items={s.warnings} tone="caution" /> : null}
              </View>
            );
          })}
        </List>
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: 0 },
  item: { borderTopWidth: layout.borderWidthPx, borderTopColor: colors.line },
  spot: { gap: space.xxs, paddingVertical: space.sm },
});
