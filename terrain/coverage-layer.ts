/**
 * Map layers of a coverage raster: one colour image per measure in a colour-blind-safe sequential palette
 * (viridis, d3-scale-chromatic; designed to stay ordered for the common colour-vision deficiencies and in grey),
 * each with a legend in numbers, and a mask of the cells that fail the spec for the map to hatch. Images are
 * one pixel per cell, in the raster's own lattice, transparent outside the area and where a measure has no value.
 */
import { interpolateViridis } from 'd3-scale-chromatic';
import type { CoverageRaster } from './coverage';
import { cellMeetsSpec, type CoverageSpec } from './coverage-spec';
import { encodePng } from './png-encode';

import type { CoverageMeasure } from './coverage-measures';

/** One legend stop: a value of the measure and its colour (#rrggbb). */
interface LegendStop { value: number; colour: string }

interface CoverageLayer {
  measure: CoverageMeasure;
  /** What the colour shows, in words. */
  label: string;
  unit: string;
  /** Values at or beyond the ends take the end colours. */
  min: number;
  max: number;
  /** The spec's limit for this measure, where the spec has one (drawn as a mark on the legend). */
  limit: number | null;
  /** Which end is better: 'low' for GSD and σ, 'high' for views. */
  better: 'low' | 'high';
  stops: LegendStop[];
  png: Uint8Array;
}

interface CoverageLayers {
  width: number;
  height: number;
  layers: CoverageLayer[];
  /** White, opaque where a cell fails any spec item; transparent elsewhere. */
  failingPng: Uint8Array;
  /** For printed reports: the GSD layer enlarged, with the failing cells' hatching drawn in (no mask needed). */
  printPng: Uint8Array;
}

/** RGBA pixels (row-major, 4 bytes each) as PNG bytes. */
export function encode(width: number, height: number, rgba: Uint8Array): Uint8Array {
  return encodePng(width, height, rgba, 6);
}

function rgbOf(hex: string): [number, number, number] {
  // interpolateViridis answers "#rrggbb" for the palette's stops and "rgb(r, g, b)" between them
  if (hex.startsWith('#')) return [parseInt(hex.slice(1, 3), 16), parseInt(hex.slice(3, 5), 16), parseInt(hex.slice(5, 7), 16)];
  const m = /rgb\((\d+),\s*(\d+),\s*(\d+)\)/.exec(hex);
  return m ? [Number(m[1]), Number(m[2]), Number(m[3])] : [0, 0, 0];
}

const hex2 = (v: number) => v.toString(16).padStart(2, '0');

/** Palette position 0..1 → colour; the better end of every measure is the palette's light (yellow) end. */
function paletteAt(t: number, better: 'low' | 'high'): [number, number, number] {
  const u = t < 0 ? 0 : t > 1 ? 1 : t;
  return rgbOf(interpolateViridis(better === 'high' ? u : 1 - u));
}

/** The 95th percentile of a measure over the area's cells with a value (for a scale that extremes do not flatten). */
function p95(band: ArrayLike<number>, inside: Uint8Array): number | null {
  const vals: number[] = [];
  for (let i = 0; i < band.length; i++) if (inside[i] && band[i] === band[i]) vals.push(band[i]);
  if (vals.length === 0) return null;
  vals.sort((a, b) => a - b);
  return vals[Math.min(vals.length - 1, Math.floor(0.95 * vals.length))];
}

const nice = (v: number, digits: number) => Number(v.toFixed(digits));

/** A mask as a map image: white and opaque where `mask[i]` is set, transparent elsewhere (one pixel per cell). */
export function maskPng(width: number, height: number, mask: Uint8Array): Uint8Array {
  const rgba = new Uint8Array(width * height * 4);
  for (let i = 0; i < width * height; i++) {
    if (!mask[i]) continue;
    const o = i * 4;
    rgba[o] = rgba[o + 1] = rgba[o + 2] = rgba[o + 3] = 255;
  }
  return encode(width, height, rgba);
}

/** The three measure layers and the failing mask of a raster under a spec. */
export function coverageLayers(r: CoverageRaster, spec: CoverageSpec): CoverageLayers {
  const { width, height, inside } = r.cells;
  const n = width * height;
  const sigmaTop = p95(r.sigmaVerticalM, inside);
  const viewsTop = p95(r.views, inside) ?? 0;
  const defs: Array<{ measure: CoverageMeasure; label: string; unit: string; band: ArrayLike<number>; min: number; max: number; limit: number | null; better: 'low' | 'high'; digits: number }> = [
    { measure: 'gsd', label: 'Finest GSD among the views', unit: 'cm', band: r.finestGsdCm, min: 0, max: nice(2 * spec.maxGsdCm, 2), limit: spec.maxGsdCm, better: 'low', digits: 2 },
    { measure: 'views', label: r.guaranteed ? 'Views (guaranteed under the attitude envelope)' : 'Views (as planned)', unit: 'views', band: r.views, min: 0, max: Math.max(2 * spec.minViews, Math.ceil(viewsTop)), limit: spec.minViews, better: 'high', digits: 0 },
    { measure: 'sigma', label: 'Predicted vertical σ (advisory)', unit: 'm', band: r.sigmaVerticalM, min: 0, max: nice(Math.max(spec.maxSigmaVerticalM !== null ? 2 * spec.maxSigmaVerticalM : 0, sigmaTop ?? 0.01), 3) || 0.01, limit: spec.maxSigmaVerticalM, better: 'low', digits: 3 },
  ];
  const layers: CoverageLayer[] = defs.map((d) => {
    const rgba = new Uint8Array(n * 4);
    const span = d.max - d.min || 1;
    for (let i = 0; i < n; i++) {
      const v = d.band[i];
      if (!inside[i] || !(v === v)) continue;
      const [cr, cg, cb] = paletteAt((v - d.min) / span, d.better);
      const o = i * 4;
      rgba[o] = cr; rgba[o + 1] = cg; rgba[o + 2] = cb; rgba[o + 3] = 255;
    }
    const stops: LegendStop[] = [0, 0.25, 0.5, 0.75, 1].map((t) => {
      const [cr, cg, cb] = paletteAt(t, d.better);
      return { value: nice(d.min + t * span, d.digits), colour: `#${hex2(cr)}${hex2(cg)}${hex2(cb)}` };
    });
    return { measure: d.measure, label: d.label, unit: d.unit, min: d.min, max: d.max, limit: d.limit, better: d.better, stops, png: encode(width, height, rgba) };
  });
  const mask = new Uint8Array(n * 4);
  for (let i = 0; i < n; i++) {
    if (!inside[i] || cellMeetsSpec(r, spec, i)) continue;
    const o = i * 4;
    mask[o] = mask[o + 1] = mask[o + 2] = mask[o + 3] = 255;
  }
  return { width, height, layers, failingPng: encode(width, height, mask), printPng: printImage(r, spec, layers[0]) };
}

/** Longest side of the printed map image, pixels (a page width at about 150 dpi). */
const PRINT_PX = 1100;

/**
 * The GSD layer for paper: each cell enlarged to whole pixels, cells short of the spec striped with dark
 * diagonals every 6 pixels (readable in black and white), white outside the area.
 */
function printImage(r: CoverageRaster, spec: CoverageSpec, gsd: CoverageLayer): Uint8Array {
  const { width, height, inside } = r.cells;
  const k = Math.max(1, Math.floor(PRINT_PX / Math.max(width, height)));
  const w = width * k, h = height * k;
  const rgba = new Uint8Array(w * h * 4).fill(255);
  const span = gsd.max - gsd.min || 1;
  for (let row = 0; row < height; row++) {
    for (let col = 0; col < width; col++) {
      const i = row * width + col;
      if (!inside[i]) continue;
      const v = r.finestGsdCm[i];
      const [cr, cg, cb] = v === v ? paletteAt((v - gsd.min) / span, 'low') : [235, 235, 235];
      const fails = !cellMeetsSpec(r, spec, i);
      for (let y = row * k; y < (row + 1) * k; y++) {
        for (let x = col * k; x < (col + 1) * k; x++) {
          const o = (y * w + x) * 4;
          const stripe = fails && (x + y) % 6 < 2;
          rgba[o] = stripe ? 20 : cr; rgba[o + 1] = stripe ? 32 : cg; rgba[o + 2] = stripe ? 42 : cb;
        }
      }
    }
  }
  return encode(w, h, rgba);
}
