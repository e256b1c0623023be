/**
 * terrain/png-encode.ts against an independent npm implementation: every image it writes is read back with
 * pngjs 7 (its own inflate, CRC and filter code), with the stored-block zlib stream and with node:zlib's deflate.
 */
import zlib from 'node:zlib';
import pngjs from 'pngjs';
import { afterEach, describe, expect, it } from 'vitest';
import { encodePng, setPngDeflate } from '../../terrain/png-encode';

const { PNG } = pngjs as unknown as typeof import('pngjs');

/** A 70 × 600 picture (over one 65,535-byte stored block) with gradients, noise and transparent holes: every filter gets chosen somewhere. */
function picture(w: number, h: number): Uint8Array {
  const px = new Uint8Array(w * h * 4);
  let seed = 7;
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      const o = (y * w + x) * 4;
      seed = (seed * 1103515245 + 12345) & 0x7fffffff;
      px[o] = (x * 3 + y) & 0xff;
      px[o + 1] = y % 50 < 25 ? (seed >> 8) & 0xff : 128;
      px[o + 2] = (x * y) & 0xff;
      px[o + 3] = (x + y) % 17 === 0 ? 0 : 255;
    }
  return px;
}

afterEach(() => setPngDeflate(null));

describe('encodePng', () => {
  for (const how of ['stored blocks', 'node:zlib deflate'] as const) {
    it(`writes RGBA and grey-with-alpha PNGs that pngjs reads back pixel for pixel (${how})`, () => {
      if (how === 'node:zlib deflate') setPngDeflate((d) => new Uint8Array(zlib.deflateSync(d)));
      const w = 70, h = 600;
      const px = picture(w, h);
      const rgba = PNG.sync.read(Buffer.from(encodePng(w, h, px, 6)));
      expect([rgba.width, rgba.height]).toEqual([w, h]);
      expect(Buffer.compare(rgba.data, Buffer.from(px))).toBe(0);
      const grey = PNG.sync.read(Buffer.from(encodePng(w, h, px, 4)));
      for (let i = 0; i < w * h; i += 97) {
        expect(grey.data[i * 4]).toBe(px[i * 4]);
        expect(grey.data[i * 4 + 3]).toBe(px[i * 4 + 3]);
      }
    });
  }

  it('uses the injected deflate, which makes a repetitive picture far smaller than stored blocks', () => {
    const flat = new Uint8Array(200 * 200 * 4).fill(90);
    const stored = encodePng(200, 200, flat).length;
    setPngDeflate((d) => new Uint8Array(zlib.deflateSync(d)));
    const deflated = encodePng(200, 200, flat).length;
    expect(stored).toBeGreaterThan(160_000);
    expect(deflated).toBeLessThan(2_000);
  });

  it('refuses sizes it cannot encode, saying what is wrong', () => {
    expect(() => encodePng(0, 3, new Uint8Array(0))).toThrow(/whole numbers above 0/);
    expect(() => encodePng(2, 2, new Uint8Array(3))).toThrow(/need 16 bytes, got 3/);
  });
});
