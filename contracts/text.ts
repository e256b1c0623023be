/**
 * Text that people type (names, notes, comments): one schema for every contract, and the cleaning every output
 * (exports, PDFs, mail) applies to stored text before writing it.
 */
import { z } from 'zod';

/**
 * Bidirectional embedding, override and isolate controls (U+202A–U+202E, U+2066–U+2069; Unicode UAX #9). An
 * override inside a plan name would reverse the text that follows it — a caution or an altitude on the leg sheet —
 * so they are removed rather than kept. Marks that only nudge neutral characters (U+200E/U+200F) are harmless.
 */
const bidiControls = /[\u202A-\u202E\u2066-\u2069]/g;

/** Control characters other than tab, line feed and carriage return, which XML 1.0 (section 2.2) forbids and files mangle. */
const controlChars = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g;

/** Unpaired UTF-16 surrogates and the noncharacters U+FFFE/U+FFFF, which XML 1.0 also forbids. */
const invalidUnicode = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]|[\uFFFE\uFFFF]/g;

/** The text with bidi controls removed. */
export function stripBidiControls(s: string): string {
  return s.replace(bidiControls, '');
}

/**
 * Stored text made safe for any file Loftline writes: no bidi controls, no control characters except tab and line
 * breaks, no characters XML 1.0 forbids. Escaping for the format is still the writer's job; this only removes what
 * no format can carry faithfully.
 */
export function plainText(s: string): string {
  return s.replace(bidiControls, '').replace(controlChars, '').replace(invalidUnicode, '');
}

/** A field of user text: bidi controls removed as it is read (chain `.trim()`, `.min()`, `.max()` as the field needs). */
export function userText(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).overwrite(stripBidiControls);
}
