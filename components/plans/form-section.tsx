/** A titled group of form fields with one sentence of explanation; fields flow in two columns where there is room. */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { space } from '../theme';
import { Card, Heading, Text } from '../ui';

export function FormSection({ title, intro, children, testID }: { title: string; intro?: string; children: ReactNode; testID?: string }) {
  return (
    <Card testID={testID}>
      <Heading level={2}>{title}</Heading>
      {intro ? (
        <Text variant="caption" tone="muted">
          {intro}
        </Text>
      ) : null}
      <View style={styles.grid}>{children}</View>
    </Card>
  );
}

/** One cell of the section grid: half the width on wide cards, the full width on phones. */
export function FieldCell({ children, wide }: { children: ReactNode; wide?: boolean }) {
  return <View style={[styles.cell, wide && styles.wideCell]}>{children}</View>;
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  cell: { flexGrow: 1, flexBasis: 180, minWidth: 0 },
  wideCell: { flexBasis: '100%' },
});
