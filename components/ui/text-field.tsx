/** Text input atom with a visible label, an optional hint and the field's error text beneath it. */
import { forwardRef, useId, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { colors, layout, radii, space, typeScale } from '../theme';
import { Text } from './text';

export type TextFieldProps = Omit<TextInputProps, 'style' | 'placeholderTextColor'> & {
  label: string;
  hint?: string;
  error?: string;
  /** Ids of further elements that describe the field (e.g. a form-level refusal banner). */
  describedBy?: string;
};

/** A labelled input; with `error` it turns red, says it is invalid and shows the message under the box. */
export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField({ label, hint, error, describedBy, testID, onFocus, onBlur, ...rest }, ref) {
  const [focused, setFocused] = useState(false);
  // Screen readers read the hint and the error when the field takes focus, not only sighted users below it.
  const id = useId().replace(/:/g, '');
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const described = [hint ? hintId : null, error ? errorId : null, describedBy ?? null].filter(Boolean).join(' ') || undefined;
  return (
    <View style={styles.wrap}>
      <Text variant="label">{label}</Text>
      {hint ? (
        <Text variant="caption" tone="muted" nativeID={hintId}>
          {hint}
        </Text>
      ) : null}
      <TextInput
        ref={ref}
        {...rest}
        testID={testID}
        aria-label={label}
        aria-invalid={Boolean(error)}
        aria-describedby={described}
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
        <Text variant="caption" tone="danger" nativeID={errorId} testID={testID ? `${testID}-error` : undefined}>
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
