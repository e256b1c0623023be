/**
 * Text from people: one rule for every field. PostgreSQL cannot store the NUL character (U+0000) in text or
 * JSON, so a NUL is refused at the boundary with a 422 instead of failing in the database with a 500.
 */
import { z } from 'zod';

/** The message for a text that holds a NUL character. */
export const NUL_MESSAGE = 'Text may not contain the NUL character (U+0000); remove it and send again.';

/** A string without NUL characters (the base of every user text field). */
export const plainText = () => z.string().refine((s) => !s.includes('\u0000'), { message: NUL_MESSAGE });

/** The path of the first string (value or key) holding a NUL in `value`, as "a.b.0.c", or null. */
export function findNul(value: unknown, path: string[] = []): string | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path.join('.') || '(body)' : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const p = findNul(value[i], [...path, String(i)]);
      if (p) return p;
    }
    return null;
  }
  if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (k.includes('\u0000')) return [...path, k.replace(/\u0000/g, '\\u0000')].join('.');
      const p = findNul(v, [...path, k]);
      if (p) return p;
    }
  }
  return null;
}
