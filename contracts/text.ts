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

/**
 * PostgreSQL cannot store the NUL character (U+0000) in text or JSON, so a NUL is refused at the boundary with a 422
 * instead of failing in the database with a 500.
 */
export const NUL_MESSAGE = 'Text may not contain the NUL character (U+0000); remove it and send again.';

/**
 * A field of user text: a NUL is refused, bidi controls are removed as it is read (chain `.trim()`, `.min()`,
 * `.max()` as the field needs).
 */
export function userText(params?: Parameters<typeof z.string>[0]) {
  return z
    .string(params)
    .refine((s) => !s.includes('\u0000'), { message: NUL_MESSAGE })
    .overwrite(stripBidiControls);
}

/**
 * The path of the first string (value or key) holding a NUL in `value`, as "a.b.0.c", or null. One shared path
 * stack and no copies per element: a 10,000-corner area is 30,000 values, and a copied path per value made this
 * walk (run on every JSON body) a few milliseconds of garbage per request.
 */
export function findNul(value: unknown, path: string[] = []): string | null {
  const stack = [...path];
  const found = (last?: string) => (last === undefined ? stack : [...stack, last]).join('.') || '(body)';
  const walk = (v: unknown): string | null => {
    if (typeof v === 'string') return v.includes('\u0000') ? found() : null;
    if (v === null || typeof v !== 'object') return null; // numbers, booleans: nothing to look at
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        const item: unknown = v[i];
        if (item === null || (typeof item !== 'object' && typeof item !== 'string')) continue;
        stack.push(String(i));
        const p = walk(item);
        stack.pop();
        if (p) return p;
      }
      return null;
    }
    for (const k in v) {
      if (!Object.prototype.hasOwnProperty.call(v, k)) continue;
      if (k.includes('\u0000')) return found(k.replace(/\u0000/g, '\\u0000'));
      stack.push(k);
      const p = walk((v as Record<string, unknown>)[k]);
      stack.pop();
      if (p) return p;
    }
    return null;
  };
  return walk(value);
}
