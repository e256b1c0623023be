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
