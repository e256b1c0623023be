/** Banner atom: an error, caution, note or success message across the content width. */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { Text, type TextTone } from './text';

type BannerTone = 'danger' | 'caution' | 'info' | 'success';

const look: Record<BannerTone, { fill: string; edge: string; ink: TextTone }> = {
  danger: { fill: colors.dangerSoft, edge: colors.danger, ink: 'danger' },
  caution: { fill: colors.cautionSoft, edge: colors.cautionLine, ink: 'caution' },
  info: { fill: colors.infoSoft, edge: colors.info, ink: 'info' },
  success: { fill: colors.successSoft, edge: colors.success, ink: 'success' },
};

type BannerProps = { tone: BannerTone; title?: string; message?: string; children?: ReactNode; testID?: string; nativeID?: string };

/** Errors are announced at once (role "alert"); the other tones are polite status messages. */
export function Banner({ tone, title, message, children, testID, nativeID }: BannerProps) {
  return (
    <View
      testID={testID}
      nativeID={nativeID}
      role={tone === 'danger' ? 'alert' : 'status'}
      style={[styles.box, { backgroundColor: look[tone].fill, borderLeftColor: look[tone].edge }]}
    >
      {title ? (
        <Text variant="bodyStrong" tone={look[tone].ink}>
          {title}
        </Text>
      ) : null}
      {message ? <Text variant="body">{message}</Text> : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    borderRadius: radii.md,
    borderLeftWidth: space.xs,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    paddingVertical: space.md,
    paddingHorizontal: space.lg,
    gap: space.xs,
  },
});
