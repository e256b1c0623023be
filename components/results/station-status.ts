/** How each station status looks: a colour, a marker shape and words (the statuses themselves: contracts/station-status.ts). */
import type { StationStatus } from '../../contracts/station-status';

/** Marker shapes: the status reads from the shape alone, so colour is never the only cue. */
export type MarkerShape = 'circle' | 'square' | 'triangle' | 'diamond' | 'cross';

interface StatusLook {
  label: string;
  /** One sentence for the legend. */
  meaning: string;
  shape: MarkerShape;
  /**
   * Fill colour. Hues from the Okabe–Ito palette (M. Okabe and K. Ito, "Color Universal Design", 2008), chosen
   * because they stay apart for the common colour-vision deficiencies; every marker also has an ink outline.
   */
  color: string;
}

export const statusLooks: Record<StationStatus, StatusLook> = {
  meets: { label: 'Meets targets', meaning: 'GSD in the band, overlaps at or above target, height within limits.', shape: 'circle', color: '#0072B2' },
  overlap: { label: 'Overlap short', meaning: 'Forward or side overlap below the target over this ground, as planned or under the attitude envelope.', shape: 'square', color: '#E69F00' },
  gsd: { label: 'GSD off band', meaning: 'GSD coarser or finer than the tolerance band allows.', shape: 'triangle', color: '#D55E00' },
  height: { label: 'Height limit', meaning: 'Below the clearance or above the maximum height above ground.', shape: 'diamond', color: '#CC79A7' },
  unknown: { label: 'No ground data', meaning: 'Nodata or off the grid under the photo: nothing could be checked.', shape: 'cross', color: '#000000' },
};
