/** A link that downloads a file from the API (a real <a href download> on the web, not in-app navigation). */
import { Pressable, StyleSheet, View, type PressableStateCallbackType } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { showFocusRing } from '../ui/focus-modality';
import { Text } from '../ui';

type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

type DownloadLinkProps = { href: string; label: string; detail?: string; testID?: string };

/**
 * Drawn like a secondary button so it is an easy target outdoors; React Native Web renders `href` with
 * `hrefAttrs.download` as an anchor, so the browser (not the router) fetches the file with the session cookie.
 */
export function DownloadLink({ href, label, detail, testID }: DownloadLinkProps) {
  const anchor = { href, hrefAttrs: { download: true } } as object;
  return (
    <Pressable
      role="link"
      {...anchor}
      testID={testID}
      style={(s: WebPressState) => [styles.box, (s.hovered || s.pressed) && styles.hover, showFocusRing(s.focused) && styles.focused]}
    >
      <View style={styles.texts}>
        <Text variant="bodyStrong" tone="primary">
          {label}
        </Text>
        {detail ? (
          <Text variant="label" tone="muted">
            {detail}
          </Text>
        ) : null}
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  box: {
    minHeight: layout.minTouchPx,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
    justifyContent: 'center',
  },
  hover: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: layout.focusRingPx },
  texts: { gap: space.xxs },
});
