/**
 * A photo's metadata read on the device (exifr), as a photo-log record: only these few numbers leave the
 * device, never the photo itself.
 *
 * Tags read (EXIF 2.32, CIPA DC-008-2019; XMP GPano, Google's "Photo Sphere XMP Metadata"):
 * - position: EXIF GPS `GPSLatitude`/`GPSLatitudeRef`, `GPSLongitude`/`GPSLongitudeRef` (WGS 84 degrees);
 * - altitude: EXIF GPS `GPSAltitude` with `GPSAltitudeRef` (0 above, 1 below sea level). EXIF defines it as
 *   metres above sea level; a receiver has sea level from its geoid model, so the record says `datum`: the
 *   height is taken as above the elevation grid's vertical datum (an approximation where the grid uses a
 *   national datum rather than a global geoid such as EGM96; the report states it);
 * - attitude: XMP `GPano:PoseHeadingDegrees` (yaw), `GPano:PosePitchDegrees` (elevation of the image centre
 *   above the horizon: −90 is straight down, so our pitch from nadir is it + 90) and `GPano:PoseRollDegrees`;
 *   without a GPano heading, EXIF GPS `GPSImgDirection` when `GPSImgDirectionRef` is `T` (true north);
 * - time: EXIF `DateTimeOriginal` with `SubSecTimeOriginal` and `OffsetTimeOriginal` when present, else the
 *   GPS `GPSDateStamp` + `GPSTimeStamp` (UTC);
 * - lens and camera: EXIF `FocalLength` (mm), IFD0 `Model`.
 * A photo without attitude is taken as looking straight down, and `assumed` says so.
 */
import exifr from 'exifr';
import { photoRecordSchema, type PhotoRecord } from '../../contracts/photo-log';

/**
 * How much of a JPEG to read: EXIF and XMP sit in APP1 segments of at most 64 KiB each at the start of the
 * file (JPEG/JFIF, ITU-T T.81 marker segments; EXIF 2.32 §4.5.4), so a device reads this head of each photo
 * (`file.slice(0, PHOTO_HEAD_BYTES)`) instead of megabytes of image data. TIFF photos may keep their tags
 * anywhere: read them whole.
 */
export const PHOTO_HEAD_BYTES = 256 * 1024;

/** What one photo says, and what had to be assumed because it does not say. */
export interface PhotoReading {
  record: PhotoRecord;
  /** Plain-language notes, e.g. "no camera attitude in the photo: looking straight down assumed". */
  assumed: string[];
}

/** A photo whose metadata cannot make a record: names the file and what is missing. */
export class PhotoMetadataError extends Error {}

type Tags = Record<string, unknown>;

const num = (v: unknown): number | null => {
  const x = Array.isArray(v) || v instanceof Uint8Array ? Number((v as ArrayLike<number>)[0]) : typeof v === 'string' ? Number(v) : v;
  return typeof x === 'number' && Number.isFinite(x) ? x : null;
};

/** "2026:05:14 10:31:07" (+ sub-seconds, + offset) to ISO 8601; null when the text is not an EXIF date. */
function exifTime(dateTime: unknown, subSec: unknown, offset: unknown): string | null {
  if (typeof dateTime !== 'string') return null;
  const m = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(dateTime.trim());
  if (!m) return null;
  const frac = typeof subSec === 'string' || typeof subSec === 'number' ? String(subSec).trim().replace(/\D/g, '') : '';
  const off = typeof offset === 'string' && /^[+-]\d{2}:\d{2}$/.test(offset.trim()) ? offset.trim() : '';
  return `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}${frac ? `.${frac}` : ''}${off === '+00:00' ? 'Z' : off}`;
}

/** GPS date stamp "2026:05:14" and time stamp [h, m, s] (UTC) to ISO 8601. */
function gpsTime(date: unknown, time: unknown): string | null {
  if (typeof date !== 'string' || !Array.isArray(time) || time.length !== 3) return null;
  const m = /^(\d{4}):(\d{2}):(\d{2})$/.exec(date.trim());
  if (!m) return null;
  const [h, mi, s] = time.map(Number);
  if (![h, mi, s].every(Number.isFinite)) return null;
  const pad = (v: number) => String(Math.floor(v)).padStart(2, '0');
  const ms = Math.round((s - Math.floor(s)) * 1000);
  return `${m[1]}-${m[2]}-${m[3]}T${pad(h)}:${pad(mi)}:${pad(s)}${ms ? `.${String(ms).padStart(3, '0')}` : ''}Z`;
}

/** Degrees into -180..180 or 0..360 kept as given, but within the record's ±360 range. */
const wrap360 = (d: number) => ((d % 360) + 360) % 360;

/**
 * Reads the record of one JPEG or TIFF photo from its bytes. Throws `PhotoMetadataError` naming the file when
 * it has no GPS position, altitude or capture time (such a photo cannot be placed).
 */
export async function readPhotoMetadata(bytes: ArrayBuffer | Uint8Array, file: string): Promise<PhotoReading> {
  let tags: { ifd0?: Tags; exif?: Tags; gps?: Tags; GPano?: Tags } | undefined;
  try {
    tags = await exifr.parse(bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes), {
      tiff: true, ifd0: { pick: ['Model'] }, exif: { pick: ['DateTimeOriginal', 'SubSecTimeOriginal', 'OffsetTimeOriginal', 'FocalLength'] },
      gps: true, xmp: true, ifd1: false, interop: false, icc: false, iptc: false, jfif: false,
      // raw values: exifr would turn DateTimeOriginal into a Date in the device's own time zone
      reviveValues: false, translateValues: false, mergeOutput: false,
    });
  } catch (err) {
    throw new PhotoMetadataError(`${file}: the photo's metadata cannot be read (${(err as Error).message}); is it a JPEG or TIFF photo?`);
  }
  const gps = tags?.gps ?? {};
  const exif = tags?.exif ?? {};
  const pano = tags?.GPano ?? {};
  const lat = num(gps.latitude), lon = num(gps.longitude);
  if (lat === null || lon === null) throw new PhotoMetadataError(`${file}: no GPS position (EXIF GPSLatitude/GPSLongitude) in the photo; it cannot be placed. Leave it out or add it to a CSV photo log by hand.`);
  const alt = num(gps.GPSAltitude);
  if (alt === null) throw new PhotoMetadataError(`${file}: no GPS altitude (EXIF GPSAltitude) in the photo; its height cannot be known. Leave it out or add it to a CSV photo log with its altitude and reference.`);
  const below = num(gps.GPSAltitudeRef) === 1;
  const time = exifTime(exif.DateTimeOriginal, exif.SubSecTimeOriginal, exif.OffsetTimeOriginal) ?? gpsTime(gps.GPSDateStamp, gps.GPSTimeStamp);
  if (time === null) throw new PhotoMetadataError(`${file}: no capture time (EXIF DateTimeOriginal or GPS date and time stamps) in the photo; the flight order of the photos needs it.`);
  const assumed: string[] = [];
  let yawDeg = num(pano.PoseHeadingDegrees);
  if (yawDeg === null) {
    const dir = num(gps.GPSImgDirection);
    const ref = typeof gps.GPSImgDirectionRef === 'string' ? gps.GPSImgDirectionRef.trim() : 'T';
    if (dir !== null && ref === 'T') yawDeg = dir;
    else if (dir !== null) assumed.push('the image direction is magnetic (GPSImgDirectionRef M), not true north: not used; the matched line\'s heading is assumed');
  }
  const elevation = num(pano.PosePitchDegrees);
  const pitchDeg = elevation === null ? null : elevation + 90;
  const rollDeg = num(pano.PoseRollDegrees);
  if (yawDeg === null) assumed.push('no camera heading in the photo: the matched line\'s heading is assumed');
  if (pitchDeg === null || rollDeg === null) assumed.push('no camera pitch or roll in the photo: looking straight down assumed');
  const focal = num(exif.FocalLength);
  const model = typeof tags?.ifd0?.Model === 'string' ? tags.ifd0.Model.replace(/\0+$/, '').trim() : '';
  const rec = {
    file, lon, lat, altitudeM: below ? -alt : alt, altitudeRef: 'datum' as const,
    yawDeg: yawDeg === null ? null : wrap360(yawDeg), pitchDeg, rollDeg, time,
    ...(focal !== null ? { focalLengthMm: focal } : {}),
    ...(model ? { cameraModel: model } : {}),
  };
  const ok = photoRecordSchema.safeParse(rec);
  if (!ok.success) throw new PhotoMetadataError(`${file}: ${ok.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}.`);
  return { record: ok.data, assumed };
}
