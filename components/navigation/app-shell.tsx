/** The signed-in frame: side column beside the content on wide screens, top bar and bottom tabs below that. */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { usesSideNav } from '../layout/breakpoints';
import { useBreakpoint } from '../layout/use-breakpoint';
import { colors } from '../theme';
import { BottomTabs } from './bottom-tabs';
import { SideNav } from './side-nav';
import { TopBar } from './top-bar';

/** Draws the navigation once, whatever the screen; screens only render their content. */
export function AppShell({ children }: { children: ReactNode }) {
  const wide = usesSideNav(useBreakpoint());
  if (wide) {
    return (
      <View style={styles.row}>
        <SideNav />
        <View role="main" style={styles.content}>
          {children}
        </View>
      </View>
    );
  }
  return (
    <View style={styles.column}>
      <TopBar />
      <View role="main" style={styles.content}>
        {children}
      </View>
      <BottomTabs />
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flex: 1, flexDirection: 'row', backgroundColor: colors.canvas },
  column: { flex: 1, backgroundColor: colors.canvas },
  content: { flex: 1, minWidth: 0 },
});
