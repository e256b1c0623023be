/**
 * The simulated flight as JPEGs: exiftool (Debian libimage-exiftool-perl 12.57) writes each photo's metadata,
 * the device-side reader (exifr) reads it back, and the as-flown analysis of the photos equals that of the CSV
 * log of the same flight.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { simulateFlight, type SimulatedFlight } from './as-flown-flight';
import { BLANK_JPEG as BLANK, exiftoolArgs, writePhotoJpegs } from '../support/photo-jpegs';
import { readPhotoMetadata, PhotoMetadataError, PHOTO_HEAD_BYTES, type PhotoReading } from '../../components/photos/read-photo-metadata';
import { parsePhotoLogCsv, photoLogToCsv, type PhotoRecord } from '../../contracts/photo-log';
import { analyseAsFlown } from '../../terrain/as-flown';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import type { FlownPhoto } from '../../terrain/as-flown-match';

const SKIP = [7, 8, 9, 10, 11, 12].map((station) => ({ line: 2, station })).concat([{ line: 4, station: 6 }]);
const dir = mkdtempSync(join(tmpdir(), 'loftline-photos-'));

let sim: SimulatedFlight;
let readings: PhotoReading[];
/** exiftool's own reading of the files it wrote (-n: numbers as stored; -G1: tag groups). */
let exiftoolRead: Array<Record<string, unknown>>;

beforeAll(async () => {
  sim = simulateFlight(SKIP);
  writePhotoJpegs(sim.photos, dir);
  exiftoolRead = JSON.parse(execFileSync('exiftool', ['-json', '-n', '-G1', ...sim.photos.map((p) => join(dir, p.file))], { encoding: 'utf8', maxBuffer: 32 << 20 }));
  readings = [];
  for (const p of sim.photos) readings.push(await readPhotoMetadata(new Uint8Array(readFileSync(join(dir, p.file))), p.file));
}, 120_000);

describe('photo metadata read on the device', () => {
  it('reads back what exiftool wrote: EXIF GPS, time, lens and model, XMP GPano attitude', () => {
    expect(readings).toHaveLength(sim.photos.length);
    readings.forEach(({ record: r }, k) => {
      const t = exiftoolRead[k];
      // exiftool 12.57's reading of the same file, tag by tag
      expect(r.lat).toBeCloseTo(t['GPS:GPSLatitude'] as number, 9); // EXIF:GPSLatitude (+ GPSLatitudeRef N)
      expect(r.lon).toBeCloseTo(t['GPS:GPSLongitude'] as number, 9); // EXIF:GPSLongitude (+ GPSLongitudeRef E)
      expect(r.altitudeM).toBe(t['GPS:GPSAltitude']); // EXIF:GPSAltitude, GPSAltitudeRef 0 = above sea level
      expect(r.altitudeRef).toBe('datum');
      expect(r.focalLengthMm).toBe(t['ExifIFD:FocalLength']); // EXIF:FocalLength
      expect(r.cameraModel).toBe(t['IFD0:Model']); // EXIF:Model (IFD0)
      expect(r.time).toBe(`${String(t['ExifIFD:DateTimeOriginal']).replace(/^(\d{4}):(\d{2}):(\d{2}) /, '$1-$2-$3T')}Z`); // EXIF:DateTimeOriginal + OffsetTimeOriginal +00:00
      if (t['XMP-GPano:PoseHeadingDegrees'] !== undefined) {
        expect(r.yawDeg).toBe(t['XMP-GPano:PoseHeadingDegrees']); // XMP-GPano:PoseHeadingDegrees
        expect(r.pitchDeg).toBeCloseTo((t['XMP-GPano:PosePitchDegrees'] as number) + 90, 9); // XMP-GPano:PosePitchDegrees, −90 = nadir
        expect(r.rollDeg).toBe(t['XMP-GPano:PoseRollDegrees']); // XMP-GPano:PoseRollDegrees
      }
      // and what the simulation wrote (GPS degrees are stored as degree/minute/second rationals: 1e-9° ≈ 0.1 mm)
      const p = sim.photos[k];
      expect(Math.abs(r.lat - p.lat)).toBeLessThan(1e-9);
      expect(Math.abs(r.lon - p.lon)).toBeLessThan(1e-9);
      expect([r.file, r.altitudeM, r.yawDeg, r.time]).toEqual([p.file, p.altitudeM, p.yawDeg, p.time]);
      expect(r.rollDeg).toBe(p.rollDeg);
      if (p.pitchDeg !== null) expect(r.pitchDeg!).toBeCloseTo(p.pitchDeg, 9);
    });
  });

  it('says when attitude is missing and nadir is assumed', () => {
    const turn = sim.photos.findIndex((p) => p.file === 'IMG_9001.JPG');
    expect(readings[turn].record).toMatchObject({ yawDeg: null, pitchDeg: null, rollDeg: null });
    expect(readings[turn].assumed.join(' ')).toMatch(/no camera heading.*no camera pitch or roll in the photo: looking straight down assumed/);
    expect(readings.filter((r) => r.assumed.length > 0)).toHaveLength(1);
  });

  it('takes the heading from EXIF GPSImgDirection without XMP, honours GPSAltitudeRef 1 (below sea level), and refuses a photo without GPS', async () => {
    const path = join(dir, 'direction-only.jpg');
    copyFileSync(BLANK, path);
    execFileSync('exiftool', ['-q', '-overwrite_original', '-n', '-EXIF:GPSLatitude=10.5', '-EXIF:GPSLatitudeRef=S', '-EXIF:GPSLongitude=70.25', '-EXIF:GPSLongitudeRef=W',
      '-EXIF:GPSAltitude=12.5', '-EXIF:GPSAltitudeRef=1', '-EXIF:GPSImgDirection=271.5', '-EXIF:GPSImgDirectionRef=T', '-EXIF:DateTimeOriginal=2026:05:14 11:00:00', '-EXIF:OffsetTimeOriginal=-05:00', path]);
    const r = await readPhotoMetadata(new Uint8Array(readFileSync(path)), 'direction-only.jpg');
    expect(r.record).toMatchObject({ lat: -10.5, lon: -70.25, altitudeM: -12.5, yawDeg: 271.5, pitchDeg: null, rollDeg: null, time: '2026-05-14T11:00:00-05:00' });
    expect(r.assumed).toEqual(['no camera pitch or roll in the photo: looking straight down assumed']);
    await expect(readPhotoMetadata(new Uint8Array(readFileSync(BLANK)), 'blank.jpg')).rejects.toThrow(PhotoMetadataError);
    await expect(readPhotoMetadata(new Uint8Array(readFileSync(BLANK)), 'blank.jpg')).rejects.toThrow(/blank.jpg: no GPS position \(EXIF GPSLatitude\/GPSLongitude\)/);
    await expect(readPhotoMetadata(new TextEncoder().encode('not a photo'), 'notes.txt')).rejects.toThrow(/notes.txt: /);
  });
});

describe('reading only the head of a large photo', () => {
  it('gives the same record as reading the whole file', async () => {
    // a 4000 x 3000 JPEG (GDAL 3.6.2 gdal_translate, as the fixture) with a photo's tags written by exiftool
    const big = join(dir, 'big.jpg');
    execFileSync('gdal_translate', ['-q', '-of', 'JPEG', '-ot', 'Byte', '-scale', '-outsize', '4000', '3000', '-co', 'QUALITY=95', 'datasets/harrow-fell-dem.tif', big], { env: { ...process.env, GDAL_PAM_ENABLED: 'NO' }, stdio: 'ignore' });
    const p = sim.photos[3];
    execFileSync('exiftool', ['-q', ...exiftoolArgs(p, big).slice(0, -1)]);
    const bytes = new Uint8Array(readFileSync(big));
    expect(bytes.length).toBeGreaterThan(2 * PHOTO_HEAD_BYTES);
    const whole = await readPhotoMetadata(bytes, p.file);
    const head = await readPhotoMetadata(bytes.subarray(0, PHOTO_HEAD_BYTES), p.file);
    expect(head).toEqual(whole);
    expect(whole.record.altitudeM).toBe(p.altitudeM);
  }, 60_000);
});

describe('CSV photo log and photos of the same flight', () => {
  it('give the same records and the same as-flown analysis', () => {
    const fromCsv: PhotoRecord[] = parsePhotoLogCsv(photoLogToCsv(sim.photos));
    const fromExif = readings.map((r) => r.record);
    expect(fromCsv).toHaveLength(fromExif.length);
    fromCsv.forEach((c, k) => {
      const e = fromExif[k];
      const { lat: cl, lon: co, pitchDeg: cp, ...cRest } = c;
      const { lat: el, lon: eo, pitchDeg: ep, ...eRest } = e;
      expect(cRest).toEqual(eRest);
      expect(Math.abs(cl - el)).toBeLessThan(1e-9);
      expect(Math.abs(co - eo)).toBeLessThan(1e-9);
      // pitch travels as the image centre's elevation (pitch − 90) and back: equal to the last bits
      if (cp === null) expect(ep).toBeNull();
      else expect(Math.abs(cp - ep!)).toBeLessThan(1e-9);
    });
    const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
    const settings = { cellM: 2, maxCells: 4_000_000, imageErrorPx: 0.5, occlusion: true };
    const a = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, fromCsv, spec, settings);
    const b = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, fromExif, spec, settings);
    expect(b.match.missed).toEqual(a.match.missed);
    expect(b.match.extra).toEqual(a.match.extra);
    expect(b.match.lines).toEqual(a.match.lines);
    expect(b.flown.views).toEqual(a.flown.views);
    expect(b.difference.lostCells).toBe(a.difference.lostCells);
    expect(b.compliance.flown.shareAll).toBe(a.compliance.flown.shareAll);
    expect(a.match.missed.map((m) => `${m.line}/${m.station}`)).toEqual(SKIP.map((s) => `${s.line}/${s.station}`));
  });
});
