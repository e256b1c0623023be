/** Text <-> number for form fields that show a scaled value (percent for fractions) and accept a decimal comma. */

/** Parses what a person typed: '' -> undefined, '12,5' -> 12.5, anything else that is not a number -> NaN. */
export function parseNumberText(text: string, scale = 1): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return Number.NaN;
  return Number(t) / scale;
}

/** The text for a value (scaled, no float noise such as 0.7 * 100 = 70.00000000000001); '' for no value. */
export function numberToText(value: number | null | undefined, scale = 1): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '';
  return String(Number((value * scale).toPrecision(12)));
}

/**
 * A range message written for stored values ("… from 0 to 0.95.") restated in the shown unit ("… from 0 to 95 %.")
 * for fields that show a scaled value; other messages pass unchanged.
 */
export function scaleRangeMessage(message: string, scale: number, unit?: string): string {
  if (scale === 1) return message;
  return message.replace(/\b(from|above) (-?\d+(?:\.\d+)?) to (-?\d+(?:\.\d+)?)\.?$/, (_m, word: string, a: string, b: string) =>
    `${word} ${numberToText(Number(a), scale)} to ${numberToText(Number(b), scale)}${unit ? ` ${unit}` : ''}.`,
  );
}
