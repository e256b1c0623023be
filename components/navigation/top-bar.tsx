/** The phone and tablet top bar: the brand and the current team with the user's role. */
import { StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { BrandMark } from '../layout/brand-mark';
import { useBreakpoint } from '../layout/use-breakpoint';
import { colors, layout, space } from '../theme';
import { TeamChip } from './team-chip';

/** Sits above the content; the team chip opens the team switcher. */
export function TopBar() {
  const insets = useSafeAreaInsets();
  // On phones the team name needs the room more than the word mark does.
  const markOnly = useBreakpoint() === 'phone';
  return (
    <View role="banner" testID="top-bar" style={[styles.bar, { paddingTop: insets.top }]}>
      <BrandMark markOnly={markOnly} />
      <TeamChip compact />
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    minHeight: layout.topBarHeightPx,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'flex-start',
    gap: space.md,
    paddingHorizontal: space.lg,
    backgroundColor: colors.surface,
    borderBottomWidth: layout.borderWidthPx,
    borderBottomColor: colors.line,
  },
});
