/** The frame of the signed-out screens: the product name, a one-line statement, and the form in a card. */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { BrandMark } from '../layout/brand-mark';
import { space } from '../theme';
import { Card, Heading, Screen, Text } from '../ui';

/** A narrow centred column, the same on phones and desktops; `aside` sits below the link to the other form. */
export function AuthFrame({ title, children, footer, aside }: { title: string; children: ReactNode; footer?: ReactNode; aside?: ReactNode }) {
  return (
    <Screen width="form" standalone documentTitle={title}>
      <View style={styles.brand}>
        <BrandMark size="large" />
        <Text tone="muted">Survey flight checks over real terrain: GSD, overlap and altitudes, line by line.</Text>
      </View>
      <Card>
        <Heading level={1} variant="title">
          {title}
        </Heading>
        {children}
      </Card>
      {footer ? <View style={styles.footer}>{footer}</View> : null}
      {aside}
    </Screen>
  );
}

const styles = StyleSheet.create({
  brand: { gap: space.sm, paddingTop: space.xl },
  footer: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs, alignItems: 'baseline' },
});
