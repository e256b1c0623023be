/** A determinate progress bar with its percentage in words (role "progressbar" for assistive technology). */
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';

/** `fraction` 0..1; the label says what is progressing ("Uploading upper-field.tif"). */
export function ProgressBar({ fraction, label, testID }: { fraction: number; label: string; testID?: string }) {
  const pct = Math.round(Math.min(1, Math.max(0, fraction)) * 100);
  return (
    <View style={styles.wrap} testID={testID}>
      <View style={styles.labels}>
        <Text variant="label">{label}</Text>
        <Text variant="label" tone="muted" testID={testID ? `${testID}-percent` : undefined}>
          {pct} %
        </Text>
      </View>
      <View role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} style={styles.track}>
        <View style={[styles.fill, { width: `${pct}%` }]} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  labels: { flexDirection: 'row', justifyContent: 'space-between', gap: space.sm },
  track: { height: space.sm, borderRadius: radii.pill, backgroundColor: colors.surfaceSunken, borderWidth: layout.borderWidthPx, borderColor: colors.line, overflow: 'hidden' },
  fill: { height: '100%', backgroundColor: colors.primary },
});
