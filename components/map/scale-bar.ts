/** The scale bar's length: the longest round ground distance (1, 2 or 5 times a power of ten) that fits the room. */

export interface ScaleBar {
  /** Ground length the bar stands for, metres. */
  lengthM: number;
  /** The bar's length on screen, screen pixels. */
  lengthPx: number;
  /** The length in words ("200 m", "1 km"). */
  label: string;
}

/** The largest 1-2-5 step at or below `maxM` (the usual round steps of map scale bars; common practice). */
export function roundDownTo125(maxM: number): number {
  if (!(Number.isFinite(maxM) && maxM > 0)) throw new RangeError(`the longest bar must be a positive number of metres, got ${maxM}.`);
  const p = 10 ** Math.floor(Math.log10(maxM));
  const f = maxM / p;
  // a whisker of slack so 5.0000000001 * p read back from floating point still counts as 5
  const step = f >= 5 - 1e-9 ? 5 : f >= 2 - 1e-9 ? 2 : 1;
  return step * p;
}

/** Metres in words: below a kilometre in metres (or centimetres below a metre), else in kilometres. */
export function lengthWords(m: number): string {
  if (m >= 1000) return `${+(m / 1000).toPrecision(6)} km`;
  if (m >= 1) return `${+m.toPrecision(6)} m`;
  return `${+(m * 100).toPrecision(6)} cm`;
}

/**
 * The scale bar for a map showing `metresPerScreenPx` of ground per screen pixel, at most `maxPx` long.
 * Throws when either figure is not a positive number.
 */
export function scaleBar(metresPerScreenPx: number, maxPx: number): ScaleBar {
  if (!(Number.isFinite(metresPerScreenPx) && metresPerScreenPx > 0)) throw new RangeError(`ground per screen pixel must be a positive number of metres, got ${metresPerScreenPx}.`);
  if (!(Number.isFinite(maxPx) && maxPx > 0)) throw new RangeError(`the bar's room must be a positive number of pixels, got ${maxPx}.`);
  const lengthM = roundDownTo125(metresPerScreenPx * maxPx);
  return { lengthM, lengthPx: lengthM / metresPerScreenPx, label: lengthWords(lengthM) };
}
