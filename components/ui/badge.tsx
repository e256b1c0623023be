/** Badge atom: a short status or role word on a soft fill. */
import { StyleSheet, View } from 'react-native';
import { colors, radii, space } from '../theme';
import { Text, type TextTone } from './text';

export type BadgeTone = 'neutral' | 'primary' | 'caution' | 'danger' | 'success' | 'info';

const look: Record<BadgeTone, { fill: string; ink: TextTone }> = {
  neutral: { fill: colors.surfaceSunken, ink: 'default' },
  primary: { fill: colors.primarySoft, ink: 'primary' },
  caution: { fill: colors.cautionSoft, ink: 'caution' },
  danger: { fill: colors.dangerSoft, ink: 'danger' },
  success: { fill: colors.successSoft, ink: 'success' },
  info: { fill: colors.infoSoft, ink: 'info' },
};

/** A pill with one or two words in it. */
export function Badge({ label, tone = 'neutral', testID }: { label: string; tone?: BadgeTone; testID?: string }) {
  return (
    <View testID={testID} style={[styles.pill, { backgroundColor: look[tone].fill }]}>
      <Text variant="caption" tone={look[tone].ink} style={styles.text}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  pill: { alignSelf: 'flex-start', borderRadius: radii.pill, paddingHorizontal: space.sm, paddingVertical: space.xxs },
  text: { fontWeight: '600' },
});
