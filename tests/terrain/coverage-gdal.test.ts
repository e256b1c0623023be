import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { computeCoverage, type CoveragePhoto } from '../../terrain/coverage';
import { cameraToLocal, castPixel } from '../../terrain/footprint';
import { localHeights } from '../../terrain/local-frame';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';

const camera: Camera = {
  sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648,
  distortion: { k1: -0.03, k2: 0.01, k3: 0, p1: 0.0004, p2: -0.0002 },
};

// gentle hills (slopes under 30 %) seen from 150–220 m: no ground is hidden from any photo
const hills = (x: number, y: number) => 30 * Math.sin(x / 70) + 20 * Math.cos(y / 55) + 0.05 * x;

describe('view counts against GDAL', () => {
  it('equal gdal_rasterize -add of the same ray-cast footprints, except in cells on a footprint edge', () => {
    const site = syntheticSite(500, 2, hills);
    const photos: CoveragePhoto[] = [];
    let s = 1;
    const rnd = () => { s = (s * 16807) % 2147483647; return s / 2147483647 - 0.5; }; // fixed-seed attitudes
    for (let line = 0; line < 3; line++) {
      for (let k = 0; k < 6; k++) {
        photos.push({ xM: -120 + line * 120, yM: -200 + k * 80, altitudeM: 220 + 10 * rnd(), yawDeg: line % 2 ? 180 : 0, pitchDeg: 6 * rnd(), rollDeg: 6 * rnd(), mountTiltDeg: line === 1 ? 10 : 0 });
      }
    }
    const raster = computeCoverage(site.grid, site.frame, site.area(-220, -250, 220, 250), camera, photos, { cellM: 2, specGsdCm: 10 });
    const { cells } = raster;
    // The footprints: 64 rays per image edge (through the distortion) cast onto the same grid, in the grid's CRS.
    const { heightAt } = localHeights(site.grid, site.frame);
    const rings = photos.map((p) => {
      const rot = cameraToLocal(camera, p);
      const pts: number[][] = [];
      const W = camera.imageWidthPx, H = camera.imageHeightPx, N = 64;
      const border: Array<[number, number]> = [];
      for (let i = 0; i < N; i++) border.push([(W * i) / N, 0]);
      for (let i = 0; i < N; i++) border.push([W, (H * i) / N]);
      for (let i = 0; i < N; i++) border.push([W - (W * i) / N, H]);
      for (let i = 0; i < N; i++) border.push([0, H - (H * i) / N]);
      for (const [u, v] of border) {
        const g = castPixel(camera, p, rot, u, v, heightAt, { toleranceM: 1e-6 })!;
        pts.push(site.toGrid(g[0], g[1]));
      }
      pts.push(pts[0]);
      return pts;
    });
    // Reference: GDAL 3.6.2 (Debian gdal-bin), burning 1 per footprint into the raster's own lattice and adding:
    //   gdal_rasterize -burn 1 -add -init 0 -ot Float32 -a_srs EPSG:32631 -te XMIN YMIN XMAX YMAX -tr CELL CELL footprints.geojson views.tif
    //   gdal_translate -of XYZ views.tif views.xyz
    // (a cell is burned when its centre lies inside a polygon, GDAL's default rasterisation rule)
    const dir = mkdtempSync(join(tmpdir(), 'loftline-cov-gdal-'));
    writeFileSync(join(dir, 'footprints.geojson'), JSON.stringify({
      type: 'FeatureCollection', crs: { type: 'name', properties: { name: 'EPSG:32631' } },
      features: rings.map((r, i) => ({ type: 'Feature', properties: { photo: i + 1 }, geometry: { type: 'Polygon', coordinates: [r] } })),
    }));
    const t = cells.transform;
    const te = [t[0], t[3] + cells.height * t[5], t[0] + cells.width * t[1], t[3]].map(String);
    execFileSync('gdal_rasterize', ['-q', '-burn', '1', '-add', '-init', '0', '-ot', 'Float32', '-a_srs', 'EPSG:32631', '-te', ...te, '-tr', String(t[1]), String(-t[5]), join(dir, 'footprints.geojson'), join(dir, 'views.tif')]);
    execFileSync('gdal_translate', ['-q', '-of', 'XYZ', join(dir, 'views.tif'), join(dir, 'views.xyz')]);
    const gdal = readFileSync(join(dir, 'views.xyz'), 'utf8').trim().split('\n').map((l) => Number(l.trim().split(/\s+/)[2]));
    expect(gdal.length).toBe(cells.width * cells.height);
    // cells whose centre lies within 1 m of a footprint's edge may fall either way (the edge is a 64-segment polyline)
    // segments grouped 16 at a time with their bounding box, so most groups are skipped at once
    const groups: Array<{ box: number[]; segs: number[] }> = [];
    for (const r of rings) {
      for (let i = 0; i + 1 < r.length; i += 16) {
        const segs: number[] = [];
        const box = [Infinity, Infinity, -Infinity, -Infinity];
        for (let q = i; q < Math.min(i + 16, r.length - 1); q++) {
          segs.push(r[q][0], r[q][1], r[q + 1][0], r[q + 1][1]);
          for (const p of [r[q], r[q + 1]]) { box[0] = Math.min(box[0], p[0]); box[1] = Math.min(box[1], p[1]); box[2] = Math.max(box[2], p[0]); box[3] = Math.max(box[3], p[1]); }
        }
        groups.push({ box, segs });
      }
    }
    const nearEdge = (x: number, y: number) => {
      for (const { box, segs } of groups) {
        if (x < box[0] - 1 || x > box[2] + 1 || y < box[1] - 1 || y > box[3] + 1) continue;
        for (let j = 0; j < segs.length; j += 4) {
        const ax = segs[j], ay = segs[j + 1], bx = segs[j + 2], by = segs[j + 3];
        const dx = bx - ax, dy = by - ay;
        const u = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
        if (Math.hypot(ax + u * dx - x, ay + u * dy - y) < 1) return true;
        }
      }
      return false;
    };
    let compared = 0, edge = 0, differ = 0, edgeDiffer = 0, total = 0;
    for (let r = 0; r < cells.height; r++) {
      for (let c = 0; c < cells.width; c++) {
        const i = r * cells.width + c;
        if (!cells.inside[i]) continue;
        total += raster.viewsPlanned[i];
        const x = t[0] + (c + 0.5) * t[1], y = t[3] + (r + 0.5) * t[5];
        const onEdge = nearEdge(x, y);
        if (raster.viewsPlanned[i] !== gdal[i]) {
          if (onEdge) edgeDiffer++;
          else differ++;
        }
        if (onEdge) edge++; else compared++;
      }
    }
    expect(differ).toBe(0);
    expect(compared).toBeGreaterThan(40_000);
    expect(edge).toBeLessThan(0.15 * (compared + edge));
    expect(edgeDiffer).toBeLessThan(0.02 * (compared + edge));
    expect(total / cells.insideCount).toBeGreaterThan(4); // overlapping photos: the comparison is not of 0s and 1s
  }, 60_000);
});
