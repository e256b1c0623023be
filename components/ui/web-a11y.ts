/** ARIA props that React Native Web renders but React Native's types do not list. */

/** Marks a navigation link as the current page (`aria-current="page"`) when `active`. */
export function ariaCurrentPage(active: boolean): object {
  return active ? { 'aria-current': 'page' } : {};
}
