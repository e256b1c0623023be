/** Screen shell: a scrolling page with a heading, optional actions, and a centred column of limited width. */
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { useBreakpoint } from '../layout/use-breakpoint';
import { colors, layout, space } from '../theme';
import { Heading, Text } from './text';

export type ScreenProps = {
  title?: string;
  subtitle?: string;
  /** Buttons beside the title (below it on phones). */
  actions?: ReactNode;
  /** `form` keeps a single column of fields narrow even on wide screens; `full` uses the whole width (side-by-side results). */
  width?: 'content' | 'form' | 'full';
  children: ReactNode;
  testID?: string;
};

/** Every screen's outer frame, so page padding and width are decided once. */
export function Screen({ title, subtitle, actions, width = 'content', children, testID }: ScreenProps) {
  const breakpoint = useBreakpoint();
  const pad = breakpoint === 'phone' ? space.lg : space.xxl;
  return (
    <ScrollView
      testID={testID}
      style={styles.scroll}
      contentContainerStyle={[styles.content, { paddingHorizontal: pad, paddingVertical: pad }]}
      keyboardShouldPersistTaps="handled"
    >
      <View style={[styles.column, width !== 'full' && { maxWidth: width === 'form' ? layout.maxFormWidthPx : layout.maxContentWidthPx }]}>
        {title || actions ? (
          <View style={[styles.header, breakpoint === 'phone' && styles.headerStacked]}>
            <View style={styles.titles}>
              {title ? <Heading level={1}>{title}</Heading> : null}
              {subtitle ? <Text tone="muted">{subtitle}</Text> : null}
            </View>
            {actions ? <View style={styles.actions}>{actions}</View> : null}
          </View>
        ) : null}
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.canvas },
  content: { flexGrow: 1, alignItems: 'center' },
  column: { width: '100%', gap: space.xl },
  header: { flexDirection: 'row', alignItems: 'flex-start', justifyContent: 'space-between', gap: space.lg },
  headerStacked: { flexDirection: 'column', alignItems: 'stretch' },
  titles: { flexShrink: 1, gap: space.xs },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
