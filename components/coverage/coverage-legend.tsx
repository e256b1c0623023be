/** The legend of a coverage layer: the colour ramp with its numbers and unit, which end is better, the spec's limit, and the hatching in words. */
import { StyleSheet, View } from 'react-native';
import type { CoverageLayerInfo } from '../../contracts/coverage';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';

export function CoverageLegend({ layer }: { layer: CoverageLayerInfo }) {
  const better = layer.better === 'low' ? 'lower is better' : 'higher is better';
  return (
    <View style={styles.wrap} testID="coverage-legend">
      <Text variant="label">
        {layer.label} ({layer.unit}; {better}
        {layer.limit !== null ? `; the spec asks ${layer.better === 'low' ? '≤' : '≥'} ${layer.limit} ${layer.unit}` : ''})
      </Text>
      <View style={styles.ramp} aria-hidden>
        {layer.stops.map((s) => (
          <View key={s.value} style={[styles.swatch, { backgroundColor: s.colour }]} />
        ))}
      </View>
      <View style={styles.numbers}>
        {layer.stops.map((s, i) => (
          <Text key={s.value} variant="caption" tone="muted" testID={`coverage-legend-stop-${i}`}>
            {i === layer.stops.length - 1 ? `≥ ${s.value}` : s.value}
          </Text>
        ))}
      </View>
      <View style={styles.hatchRow}>
        <View style={styles.hatchSample} aria-hidden>
          {[0, 1, 2, 3].map((i) => (
            <View key={i} style={[styles.hatchStroke, { left: i * 7 - 4 }]} />
          ))}
        </View>
        <Text variant="caption">Hatched: short of the spec on at least one item. Where no photo sees a cell, only the hatching shows.</Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  ramp: { flexDirection: 'row', height: space.md, borderRadius: radii.sm, overflow: 'hidden', borderWidth: layout.borderWidthPx, borderColor: colors.line },
  swatch: { flex: 1 },
  numbers: { flexDirection: 'row', justifyContent: 'space-between' },
  hatchRow: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  hatchSample: { width: 24, height: 16, overflow: 'hidden', borderWidth: layout.borderWidthPx, borderColor: colors.lineStrong, backgroundColor: colors.surfaceSunken },
  hatchStroke: { position: 'absolute', top: -4, width: 2, height: 26, backgroundColor: colors.ink, transform: [{ rotate: '45deg' }] },
});
