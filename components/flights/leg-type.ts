/** Type sizes that exist only on the leg sheet. */
import { fontFamilies } from '../theme';

/**
 * The altitude a pilot sets, read off a phone held at arm's length in sunlight: deliberately larger than the theme's
 * display size (30 px), the only figure on any screen that is.
 */
export const altitudeFigureType = { fontFamily: fontFamilies.bold, fontSize: 48, lineHeight: 56 } as const;
