/** Choice-group atom: a row of mutually exclusive options (a radio group drawn as segments). */
import { Pressable, StyleSheet, View, type PressableStateCallbackType } from 'react-native';
import { colors, layout, opacity, radii, space } from '../theme';
import { showFocusRing } from './focus-modality';
import { Text } from './text';

export type Choice<T extends string> = { value: T; label: string };

export type ChoiceGroupProps<T extends string> = {
  /** Names the whole group for screen readers, e.g. "Role of Rhea Castellan". */
  label: string;
  choices: readonly Choice<T>[];
  value: T;
  onChange: (value: T) => void;
  disabled?: boolean;
  testID?: string;
};

type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

/** Segments that wrap onto a second row on narrow screens rather than shrinking below a readable size. */
export function ChoiceGroup<T extends string>({ label, choices, value, onChange, disabled, testID }: ChoiceGroupProps<T>) {
  return (
    <View role="radiogroup" aria-label={label} testID={testID} style={styles.group}>
      {choices.map((choice) => {
        const selected = choice.value === value;
        return (
          <Pressable
            key={choice.value}
            role="radio"
            aria-checked={selected}
            aria-label={choice.label}
            aria-disabled={disabled}
            disabled={disabled}
            testID={testID ? `${testID}-${choice.value}` : undefined}
            onPress={() => {
              if (!selected) onChange(choice.value);
            }}
            style={(state: WebPressState) => [
              styles.segment,
              selected ? styles.selected : state.hovered || state.pressed ? styles.hovered : null,
              disabled && styles.disabled,
              showFocusRing(state.focused) && styles.focused,
            ]}
          >
            <Text variant="label" tone={selected ? 'inverse' : 'default'}>
              {choice.label}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  group: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  segment: {
    minHeight: layout.compactControlPx,
    paddingHorizontal: space.md,
    justifyContent: 'center',
    borderRadius: radii.pill,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
  },
  selected: { backgroundColor: colors.primary, borderColor: colors.primary },
  hovered: { backgroundColor: colors.surfaceSunken },
  disabled: { opacity: opacity.disabled },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: layout.focusRingPx },
});
