/** Card atom: a bordered surface that groups related content. */
import type { ReactNode } from 'react';
import { StyleSheet, View, type StyleProp, type ViewStyle } from 'react-native';
import { colors, layout, radii, space } from '../theme';

type CardProps = { children: ReactNode; style?: StyleProp<ViewStyle>; testID?: string; padded?: boolean };

/** A white panel with a hairline border; `padded={false}` for lists that draw their own row padding. */
export function Card({ children, style, testID, padded = true }: CardProps) {
  return (
    <View testID={testID} style={[styles.card, padded && styles.padded, style]}>
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    backgroundColor: colors.surface,
    borderColor: colors.line,
    borderWidth: layout.borderWidthPx,
    borderRadius: radii.lg,
    overflow: 'hidden',
  },
  padded: { padding: space.lg, gap: space.md },
});
