/**
 * Photos of a simulated flight as JPEG files: a blank 16x12 JPEG per photo with its metadata written by exiftool
 * (Debian libimage-exiftool-perl 12.57), one exiftool process for all of them (-@ argument file, one -execute per
 * photo). Used by the device-side reader's tests and by the browser test of the photo check.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { FlownPhoto } from '../../terrain/as-flown-match';

/** A blank 16x12 JPEG with no metadata (tests/fixtures/photos). */
export const BLANK_JPEG = new URL('../fixtures/photos/blank-16x12.jpg', import.meta.url);

/** "2026-05-14T09:31:07Z" as an EXIF date "2026:05:14 09:31:07" (EXIF 2.32 DateTimeOriginal format). */
const exifDate = (iso: string) => iso.slice(0, 19).replace(/-/g, ':').replace('T', ' ');

/**
 * exiftool arguments writing one photo record: EXIF GPS position, altitude and image direction, capture time
 * with its offset, focal length and model, and the camera attitude as XMP GPano pose (pitch as the image
 * centre's elevation above the horizon: −90 is straight down).
 */
export function exiftoolArgs(p: FlownPhoto, path: string): string[] {
  const a = [
    '-overwrite_original', '-n',
    `-EXIF:GPSLatitude=${Math.abs(p.lat)}`, `-EXIF:GPSLatitudeRef=${p.lat >= 0 ? 'N' : 'S'}`,
    `-EXIF:GPSLongitude=${Math.abs(p.lon)}`, `-EXIF:GPSLongitudeRef=${p.lon >= 0 ? 'E' : 'W'}`,
    `-EXIF:GPSAltitude=${Math.abs(p.altitudeM)}`, `-EXIF:GPSAltitudeRef=${p.altitudeM >= 0 ? 0 : 1}`,
    `-EXIF:DateTimeOriginal=${exifDate(p.time)}`, '-EXIF:OffsetTimeOriginal=+00:00',
  ];
  if (p.focalLengthMm !== undefined) a.push(`-EXIF:FocalLength=${p.focalLengthMm}`);
  if (p.cameraModel !== undefined) a.push(`-EXIF:Model=${p.cameraModel}`);
  if (p.yawDeg !== null) a.push(`-EXIF:GPSImgDirection=${p.yawDeg}`, '-EXIF:GPSImgDirectionRef=T', `-XMP-GPano:PoseHeadingDegrees=${p.yawDeg}`);
  if (p.pitchDeg !== null) a.push(`-XMP-GPano:PosePitchDegrees=${p.pitchDeg - 90}`);
  if (p.rollDeg !== null) a.push(`-XMP-GPano:PoseRollDegrees=${p.rollDeg}`);
  return [...a, path, '-execute'];
}

/** Write one JPEG per photo into `dir` (named by the photo's file); the paths, in order. */
export function writePhotoJpegs(photos: readonly FlownPhoto[], dir: string): string[] {
  const args: string[] = [];
  const paths: string[] = [];
  for (const p of photos) {
    const path = join(dir, p.file);
    copyFileSync(BLANK_JPEG, path);
    args.push(...exiftoolArgs(p, path));
    paths.push(path);
  }
  writeFileSync(join(dir, 'exiftool-args.txt'), `${args.join('\n')}\n`);
  execFileSync('exiftool', ['-q', '-@', join(dir, 'exiftool-args.txt')]);
  return paths;
}
