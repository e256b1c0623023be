/** Screen shell: a scrolling page with a heading, optional actions, and a centred column of limited width. */
import { useEffect, useRef, type ReactNode } from 'react';
import { Platform, ScrollView, StyleSheet, View, type Text as NativeText } from 'react-native';
import { useBreakpoint } from '../layout/use-breakpoint';
import { colors, layout, space } from '../theme';
import { Heading, Text } from './text';

type ScreenProps = {
  title?: string;
  subtitle?: string;
  /** Buttons beside the title (below it on phones). */
  actions?: ReactNode;
  /** `form` keeps a single column of fields narrow even on wide screens; `full` uses the whole width (side-by-side results). */
  width?: 'content' | 'form' | 'full';
  children: ReactNode;
  testID?: string;
  /** The browser tab's and history's name for the screen when the title alone is not specific ("Leg sheet — …"). */
  documentTitle?: string;
  /** Screens outside the signed-in frame (which draws the main landmark itself) are their own main region. */
  standalone?: boolean;
};

/** Every screen names itself in the document title, so tabs, history and screen readers tell screens apart. */
function useDocumentTitle(name: string | undefined): void {
  useEffect(() => {
    if (Platform.OS === 'web' && name) document.title = `${name} · Loftline`;
  }, [name]);
}

/**
 * After a change of screen, focus goes to the new screen's main heading (once it has its words), so keyboard and
 * screen-reader users start at the top of what they opened and hear its name; otherwise focus stays on the old link
 * that no longer exists, i.e. on the page body.
 */
function useFocusOnArrival(ready: boolean) {
  const heading = useRef<NativeText>(null);
  const done = useRef(false);
  useEffect(() => {
    if (Platform.OS !== 'web' || !ready || done.current) return;
    done.current = true;
    const el = heading.current as unknown as HTMLElement | null;
    // Leave focus alone when it is already inside the new screen (a field that focuses itself); a link in the
    // navigation that stays on screen, the body, or a removed element of the old screen all hand over.
    const active = document.activeElement;
    const main = el?.closest('[role="main"]');
    const insideNewScreen = active && active !== document.body && document.body.contains(active) && main?.contains(active);
    if (el && !insideNewScreen) el.focus({ preventScroll: true });
  }, [ready]);
  return heading;
}

/** Every screen's outer frame, so page padding and width are decided once. */
export function Screen({ title, subtitle, actions, width = 'content', children, testID, documentTitle, standalone = false }: ScreenProps) {
  const breakpoint = useBreakpoint();
  useDocumentTitle(documentTitle ?? title);
  const heading = useFocusOnArrival(Boolean(title));
  const pad = breakpoint === 'phone' ? space.lg : space.xxl;
  const page = (
    <ScrollView
      testID={testID}
      style={styles.scroll}
      contentContainerStyle={[styles.content, { paddingHorizontal: pad, paddingVertical: pad }]}
      keyboardShouldPersistTaps="handled"
      // The page scrolls inside this region, so it must be reachable by keyboard even where it holds no control.
      tabIndex={0}
    >
      <View style={[styles.column, width !== 'full' && { maxWidth: width === 'form' ? layout.maxFormWidthPx : layout.maxContentWidthPx }]}>
        {title || actions ? (
          <View style={[styles.header, breakpoint === 'phone' && styles.headerStacked]}>
            <View style={styles.titles}>
              {title ? (
                <Heading level={1} ref={heading} tabIndex={-1} style={styles.heading}>
                  {title}
                </Heading>
              ) : null}
              {subtitle ? <Text tone="muted">{subtitle}</Text> : null}
            </View>
            {actions ? <View style={styles.actions}>{actions}</View> : null}
          </View>
        ) : null}
        {children}
      </View>
    </ScrollView>
  );
  return standalone ? (
    <View role="main" style={styles.scroll}>
      {page}
    </View>
  ) : (
    page
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.canvas },
  content: { flexGrow: 1, alignItems: 'center' },
  column: { width: '100%', gap: space.xl },
  header: { flexDirection: 'row', alignItems: 'flex-start', justifyContent: 'space-between', gap: space.lg },
  headerStacked: { flexDirection: 'column', alignItems: 'stretch' },
  titles: { flexShrink: 1, gap: space.xs },
  // Focus lands on the heading by script only (never by Tab), so it draws no ring.
  heading: { outlineWidth: 0, outlineColor: 'transparent' },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
