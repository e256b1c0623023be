/**
 * Keyboard handling the web's native controls have and react-native-web's Pressable lacks for non-button roles:
 * Space toggles a checkbox and picks a radio (WAI-ARIA Authoring Practices, checkbox and radio group patterns),
 * and arrow keys move through a radio group.
 */
type KeyEventLike = { nativeEvent?: { key?: string }; key?: string; preventDefault?: () => void };

const keyOf = (e: KeyEventLike) => e.nativeEvent?.key ?? e.key ?? '';

/** onKeyDown for a checkbox or radio: Space acts as a press (Enter already does, through Pressable). */
export function spaceActivates(act: () => void) {
  return (e: KeyEventLike) => {
    const key = keyOf(e);
    if (key === ' ' || key === 'Spacebar') {
      e.preventDefault?.();
      act();
    }
  };
}

/** The index an arrow key moves to in a group of `count` (wrapping), or null for any other key. */
export function arrowStep(e: KeyEventLike, index: number, count: number): number | null {
  const key = keyOf(e);
  if (key === 'ArrowRight' || key === 'ArrowDown') return (index + 1) % count;
  if (key === 'ArrowLeft' || key === 'ArrowUp') return (index - 1 + count) % count;
  return null;
}

/** react-native-web props that React Native's types do not declare; spread onto a Pressable. */
export function webKeyProps(p: { onKeyDown?: (e: KeyEventLike) => void; tabIndex?: 0 | -1 }): object {
  return p;
}
