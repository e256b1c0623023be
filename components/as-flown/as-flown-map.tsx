/** The as-flown map of a check: each cell as met, short as planned too, or lost in flight, with the re-flight stretches drawn on it; legend in words. */
import { Image, StyleSheet, View } from 'react-native';
import type { AsFlownDoc } from '../../contracts/as-flown';
import { colors, layout, radii, space } from '../theme';
import { Heading, Text } from '../ui';

type MapDoc = NonNullable<AsFlownDoc['map']>;

/** testIDs: as-flown-map, as-flown-map-image, as-flown-map-legend. */
export function AsFlownMap({ map }: { map: MapDoc }) {
  const words = map.legend.map((l) => l.words).join('; ');
  return (
    <View style={styles.wrap} testID="as-flown-map">
      <Heading level={3}>Map as flown</Heading>
      <Image
        source={{ uri: `data:image/png;base64,${map.pngBase64}` }}
        style={[styles.image, { aspectRatio: map.widthPx / map.heightPx }]}
        resizeMode="contain"
        accessibilityLabel={`Map of the survey area as flown, north up. ${words}.`}
        testID="as-flown-map-image"
      />
      <View style={styles.legend} testID="as-flown-map-legend">
        {map.legend.map((l) => (
          <View key={l.colour} style={styles.row}>
            <View style={[styles.swatch, { backgroundColor: l.colour }]} aria-hidden />
            <Text variant="caption" style={styles.words}>{l.words}</Text>
          </View>
        ))}
      </View>
      <Text variant="caption" tone="muted">{map.note}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  image: { width: '100%', maxWidth: 760, borderWidth: layout.borderWidthPx, borderColor: colors.line, borderRadius: radii.sm, backgroundColor: colors.surface },
  legend: { gap: 4 },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  swatch: { width: 16, height: 16, borderRadius: 2, borderWidth: layout.borderWidthPx, borderColor: colors.lineStrong },
  words: { flexShrink: 1 },
});
