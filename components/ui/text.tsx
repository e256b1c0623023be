/** Typography atom: every piece of text in the app goes through one of the theme's type variants. */
import type { Ref } from 'react';
import { Text as RNText, StyleSheet, type TextProps as RNTextProps } from 'react-native';
import { colors, typeScale, type TypeVariant } from '../theme';

export type TextTone = 'default' | 'muted' | 'primary' | 'danger' | 'caution' | 'success' | 'info' | 'inverse';

const toneColor: Record<TextTone, string> = {
  default: colors.ink,
  muted: colors.inkMuted,
  primary: colors.primary,
  danger: colors.danger,
  caution: colors.caution,
  success: colors.success,
  info: colors.info,
  inverse: colors.inkInverse,
};

/** `ref` is an ordinary prop in React 19; `tabIndex` is react-native-web's (-1: focusable by script only). */
type TextProps = RNTextProps & { variant?: TypeVariant; tone?: TextTone; ref?: Ref<RNText>; tabIndex?: 0 | -1 };

/** Text in a theme variant and tone; extra styles come last so layouts can add margins. */
export function Text({ variant = 'body', tone = 'default', style, ...rest }: TextProps) {
  return <RNText {...rest} style={[styles.base, typeScale[variant], { color: toneColor[tone] }, style]} />;
}

/** A page or section heading announced as a heading to assistive technology. */
export function Heading({ level = 1, variant, ...rest }: TextProps & { level?: 1 | 2 | 3 }) {
  const chosen: TypeVariant = variant ?? (level === 1 ? 'heading' : 'title');
  return <Text {...rest} variant={chosen} role="heading" aria-level={level} />;
}

const styles = StyleSheet.create({ base: { flexShrink: 1 } });
