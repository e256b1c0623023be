/** Text input atom with a visible label, an optional hint and the field's error text beneath it. */
import { forwardRef, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { colors, layout, radii, space, typeScale } from '../theme';
import { Text } from './text';

export type TextFieldProps = Omit<TextInputProps, 'style' | 'placeholderTextColor'> & {
  label: string;
  hint?: string;
  error?: string;
};

/** A labelled input; with `error` it turns red, says it is invalid and shows the message under the box. */
export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField({ label, hint, error, testID, onFocus, onBlur, ...rest }, ref) {
  const [focused, setFocused] = useState(false);
  return (
    <View style={styles.wrap}>
      <Text variant="label">{label}</Text>
      {hint ? (
        <Text variant="caption" tone="muted">
          {hint}
        </Text>
      ) : null}
      <TextInput
        ref={ref}
        {...rest}
        testID={testID}
        aria-label={label}
        aria-invalid={Boolean(error)}
        placeholderTextColor={colors.inkMuted}
        onFocus={(e) => {
          setFocused(true);
          onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          onBlur?.(e);
        }}
        style={[styles.input, focused && styles.focused, error ? styles.invalid : null]}
      />
      {error ? (
        <Text variant="caption" tone="danger" testID={testID ? `${testID}-error` : undefined}>
          {error}
        </Text>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  input: {
    ...typeScale.body,
    color: colors.ink,
    minHeight: layout.minTouchPx,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
  },
  focused: { borderColor: colors.focus, outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
  invalid: { borderColor: colors.danger },
});
