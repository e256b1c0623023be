/** Whether focus came from the keyboard, so focus rings show for keyboard users but not after a mouse click or tap. */

let keyboardModality = false;

// Listeners go on the window once; capture phase so they run before any control's own handler moves focus.
if (typeof window !== 'undefined' && typeof window.addEventListener === 'function') {
  const keyboard = (e: KeyboardEvent) => {
    if (!e.metaKey && !e.ctrlKey && !e.altKey) keyboardModality = true;
  };
  const pointer = () => {
    keyboardModality = false;
  };
  window.addEventListener('keydown', keyboard, true);
  window.addEventListener('pointerdown', pointer, true);
  window.addEventListener('mousedown', pointer, true);
  window.addEventListener('touchstart', pointer, true);
}

/** True when a focused control should draw its focus ring (the CSS :focus-visible rule, for React Native Web). */
export function showFocusRing(focused: boolean | undefined): boolean {
  return Boolean(focused) && keyboardModality;
}
