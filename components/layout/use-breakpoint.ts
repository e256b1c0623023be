/** The current named breakpoint, following window resizes. */
import { useWindowDimensions } from 'react-native';
import { breakpointFor, type Breakpoint } from './breakpoints';

/** Reads the window width and maps it through `breakpointFor`. */
export function useBreakpoint(): Breakpoint {
  const { width } = useWindowDimensions();
  return breakpointFor(width);
}
