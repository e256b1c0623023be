/** Choice-group atom: a row of mutually exclusive options (a radio group drawn as segments). */
import { useRef } from 'react';
import { Pressable, StyleSheet, View, type PressableStateCallbackType, type View as NativeView } from 'react-native';
import { arrowStep, spaceActivates, webKeyProps } from './keys';
import { colors, layout, opacity, radii, space } from '../theme';
import { showFocusRing } from './focus-modality';
import { Text } from './text';

type Choice<T extends string> = { value: T; label: string };

type ChoiceGroupProps<T extends string> = {
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
  // One tab stop for the group (the chosen option); arrows move the choice, as in a native radio group.
  const refs = useRef<(NativeView | null)[]>([]);
  const move = (index: number, e: Parameters<typeof arrowStep>[0]) => {
    const next = arrowStep(e, index, choices.length);
    if (next === null || disabled) return;
    e.preventDefault?.();
    onChange(choices[next].value);
    (refs.current[next] as unknown as HTMLElement | null)?.focus?.();
  };
  return (
    <View role="radiogroup" aria-label={label} testID={testID} style={styles.group}>
      {choices.map((choice, index) => {
        const selected = choice.value === value;
        return (
          <Pressable
            key={choice.value}
            ref={(el) => {
              refs.current[index] = el;
            }}
            {...webKeyProps({
              tabIndex: selected || (index === 0 && !choices.some((c) => c.value === value)) ? 0 : -1,
              onKeyDown: (e) => {
                spaceActivates(() => !selected && onChange(choice.value))(e);
                move(index, e);
              },
            })}
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
