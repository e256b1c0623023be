import { describe, expect, it } from 'vitest';
import { createProjectSchema } from '../../contracts/projects';
import { plainText, stripBidiControls, userText } from '../../contracts/text';

// The bidi controls of Unicode UAX #9 (embeddings, overrides, isolates), written by code point.
const bidi = [0x202a, 0x202b, 0x202c, 0x202d, 0x202e, 0x2066, 0x2067, 0x2068, 0x2069].map((c) => String.fromCodePoint(c));

describe('user text', () => {
  it('loses every bidi embedding, override and isolate control, and nothing else', () => {
    const s = `Ridge ${bidi.join('')}north ﻿é 山 \u200E`;
    expect(stripBidiControls(s)).toBe('Ridge north ﻿é 山 \u200E');
    for (const c of bidi) expect(userText().parse(`a${c}b`)).toBe('ab');
  });

  it('keeps the field rules around it: trimmed after stripping, lengths checked on the clean text', () => {
    const r = createProjectSchema.safeParse({ name: `  ${bidi[4]}A${bidi[2]} ` });
    expect(r.success).toBe(false); // one visible character: under the 2-character minimum once the controls are gone
    expect(createProjectSchema.parse({ name: `\u202Etsew Hollin` }).name).toBe('tsew Hollin');
  });

  it('cleans stored text for files: controls XML 1.0 forbids and lone surrogates go; tab and line breaks stay', () => {
    expect(plainText('a\u0000b\u0007c\u001Fd\u007F\te\r\nf')).toBe('abcd\te\r\nf');
    expect(plainText('x\uD800y\uDC00z\uFFFE')).toBe('xyz');
    expect(plainText('😀')).toBe('😀'); // a proper surrogate pair is kept
  });
});
