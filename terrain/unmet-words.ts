/** The reasons a flight line leaves the GSD band (or the height limit), and how they read to people. */

/** Why the band could not be held on a stretch: the engine's reason codes (the plan result's schema takes this list). */
export const unmetReasons = ['ground-unknown', 'above-max-agl', 'max-agl-ahead', 'band-above-max-agl', 'clearance-above-band', 'climb-limit', 'descent-limit', 'hold', 'steps', 'leg-limits'] as const;
export type UnmetReason = (typeof unmetReasons)[number];

/** Why a stretch leaves the band, in words (the reason codes never reach users). */
export const unmetReasonWords: Record<UnmetReason, string> = {
  'ground-unknown': 'no elevation data under the line',
  'above-max-agl': 'the aircraft would be above the height limit',
  'max-agl-ahead': 'keeping under the height limit over lower ground nearby',
  'band-above-max-agl': 'the target GSD needs more height than the height limit allows',
  'clearance-above-band': 'the clearance is above the height the GSD band allows',
  'climb-limit': 'the ground rises faster than the climb limit allows',
  'descent-limit': 'the ground falls faster than the descent limit allows',
  hold: 'one altitude per line (hold mode) cannot follow the ground',
  steps: 'a few level legs (steps mode) cannot follow the ground',
  'leg-limits': 'the shortest-leg and most-legs settings',
};

/** A length of line in words: whole metres with thousands separated, or "less than a metre". */
export function lineLengthWords(m: number): string {
  return m < 0.5 ? 'less than a metre' : `${Math.round(m).toLocaleString('en-GB')} m`;
}

/**
 * The stretches off the band summed by reason, in words, longest first: "the ground rises faster than the climb
 * limit allows (636 m); …". A reason code this build does not know reads "the altitude limits".
 */
export function unmetByReasonWords(metresByReason: ReadonlyMap<string, number>): string {
  return [...metresByReason]
    .sort((p, q) => q[1] - p[1])
    .map(([r, m]) => `${(unmetReasonWords as Record<string, string>)[r] ?? 'the altitude limits'} (${lineLengthWords(m)})`)
    .join('; ');
}
