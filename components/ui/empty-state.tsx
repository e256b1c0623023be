/** Empty-state atom: what a list shows before it has anything in it, and what to do next. */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { Heading, Text } from './text';

/** `level` 1 where the panel is the whole screen (no other main heading). */
type EmptyStateProps = { title: string; message?: string; action?: ReactNode; testID?: string; level?: 1 | 2 };

/** A dashed panel with a title, one explaining sentence and an optional action. */
export function EmptyState({ title, message, action, testID, level = 2 }: EmptyStateProps) {
  return (
    <View testID={testID} style={styles.box}>
      <Heading level={level} style={styles.centre}>
        {title}
      </Heading>
      {message ? (
        <Text tone="muted" style={styles.centre}>
          {message}
        </Text>
      ) : null}
      {action ? <View style={styles.action}>{action}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    alignItems: 'center',
    gap: space.sm,
    paddingVertical: space.xxxl,
    paddingHorizontal: space.xl,
    borderRadius: radii.lg,
    borderWidth: layout.borderWidthPx,
    borderStyle: 'dashed',
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
  },
  centre: { textAlign: 'center' },
  action: { marginTop: space.sm },
});
