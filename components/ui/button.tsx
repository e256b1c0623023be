/** Button atom: primary, secondary, danger and quiet variants, with a busy state and a visible focus ring. */
import { ActivityIndicator, Pressable, StyleSheet, View, type PressableStateCallbackType, type StyleProp, type ViewStyle } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { showFocusRing } from './focus-modality';
import { Text, type TextTone } from './text';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

type ButtonProps = {
  label: string;
  onPress?: () => void;
  variant?: ButtonVariant;
  disabled?: boolean;
  busy?: boolean;
  /** Said instead of `label` by screen readers, when the label alone is ambiguous ("Remove" → "Remove Ada"). */
  accessibilityLabel?: string;
  testID?: string;
  size?: 'regular' | 'compact';
  style?: StyleProp<ViewStyle>;
};

/** React Native Web adds hover and focus to the pressable state; native only has `pressed`. */
type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

const fill: Record<ButtonVariant, { rest: string; pressed: string; ink: TextTone; border: string }> = {
  primary: { rest: colors.primary, pressed: colors.primaryPressed, ink: 'inverse', border: colors.primary },
  secondary: { rest: colors.surface, pressed: colors.surfaceSunken, ink: 'primary', border: colors.lineStrong },
  danger: { rest: colors.surface, pressed: colors.dangerSoft, ink: 'danger', border: colors.danger },
  quiet: { rest: 'transparent', pressed: colors.surfaceSunken, ink: 'primary', border: 'transparent' },
};

/** A pressable with role "button"; disabled and busy buttons ignore presses and say so to assistive technology. */
export function Button({ label, onPress, variant = 'primary', disabled, busy, accessibilityLabel, testID, size = 'regular', style }: ButtonProps) {
  const inactive = Boolean(disabled || busy);
  const look = fill[variant];
  return (
    <Pressable
      role="button"
      aria-label={accessibilityLabel ?? label}
      aria-disabled={inactive}
      aria-busy={Boolean(busy)}
      disabled={inactive}
      onPress={onPress}
      testID={testID}
      style={(state: WebPressState) => [
        styles.base,
        size === 'compact' && styles.compact,
        { backgroundColor: state.pressed || state.hovered ? look.pressed : look.rest, borderColor: look.border },
        inactive && styles.inactive,
        showFocusRing(state.focused) && styles.focused,
        style,
      ]}
    >
      <View style={styles.row}>
        {busy ? <ActivityIndicator aria-hidden size="small" color={variant === 'primary' ? colors.inkInverse : colors.primary} /> : null}
        <Text variant="label" tone={inactive ? 'muted' : look.ink} style={styles.label}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: layout.minTouchPx,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    alignItems: 'center',
    justifyContent: 'center',
  },
  compact: { minHeight: layout.compactControlPx, paddingHorizontal: space.md, paddingVertical: space.xs },
  inactive: { backgroundColor: colors.disabledFill, borderColor: colors.disabledFill },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: layout.focusRingPx },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  label: { textAlign: 'center' },
});
