/**
 * A photo log: one record per photo as flown (position, altitude with its reference, camera attitude, capture
 * time, lens and camera model), from the photos' EXIF/XMP on the device or from a CSV file with the header
 * `file,lon,lat,altitudeM,altitudeRef,yawDeg,pitchDeg,rollDeg,time` (optional `focalLengthMm,cameraModel`).
 */
import Papa from 'papaparse';
import { z } from 'zod';

/**
 * What a photo's altitude is measured from: `ellipsoid` the WGS 84 ellipsoid (a satellite receiver's raw
 * height), `datum` the elevation grid's vertical datum (mean sea level as the receiver's geoid model has it is
 * taken as this), `takeoff` the ground at the plan's takeoff point.
 */
const altitudeRefs = ['ellipsoid', 'datum', 'takeoff'] as const;

/** The CSV columns, in this order; `focalLengthMm` and `cameraModel` may follow. */
export const PHOTO_LOG_COLUMNS = ['file', 'lon', 'lat', 'altitudeM', 'altitudeRef', 'yawDeg', 'pitchDeg', 'rollDeg', 'time'] as const;
const PHOTO_LOG_OPTIONAL_COLUMNS = ['focalLengthMm', 'cameraModel'] as const;

/** Most photos one log may hold (a long survey day; the coverage of more should be split by flight). */
export const MAX_PHOTO_LOG_ROWS = 20_000;

const ranged = (name: string, min: number, max: number) => {
  const msg = `${name} must be a number from ${min} to ${max}`;
  return z.number({ error: msg }).gte(min, { error: msg }).lte(max, { error: msg });
};

/**
 * One photo. Attitude is the camera's, with 0/0 looking straight down: `yawDeg` the heading the camera faces
 * (the aircraft's nose on a fixed mount; degrees clockwise from true north), `pitchDeg` the tilt of the optical
 * axis from straight down towards that heading (forward positive), `rollDeg` the tilt to the right of it; null
 * when the photo does not say (nadir along the matched line is then assumed, and the report says so).
 */
export const photoRecordSchema = z.object({
  file: z.string().trim().min(1, { error: 'file must name the photo' }).max(500, { error: 'file must be at most 500 characters' }),
  lon: ranged('lon', -180, 180),
  lat: ranged('lat', -90, 90),
  altitudeM: ranged('altitudeM', -1000, 20_000),
  altitudeRef: z.enum(altitudeRefs, { error: 'altitudeRef must be one of ellipsoid, datum, takeoff' }),
  yawDeg: ranged('yawDeg', -360, 360).nullable(),
  pitchDeg: ranged('pitchDeg', -90, 90).nullable(),
  rollDeg: ranged('rollDeg', -90, 90).nullable(),
  time: z.iso.datetime({ offset: true, local: true, error: 'time must be an ISO 8601 date and time, e.g. 2026-05-14T10:31:07Z' }),
  focalLengthMm: ranged('focalLengthMm', 0.5, 2000).optional(),
  cameraModel: z.string().trim().max(200).optional(),
});
export type PhotoRecord = z.infer<typeof photoRecordSchema>;

export const photoLogSchema = z.array(photoRecordSchema).min(1).max(MAX_PHOTO_LOG_ROWS);

/** A photo log that cannot be read: every problem found (row numbers count the header as row 1). */
export class PhotoLogError extends Error {
  constructor(readonly problems: string[]) {
    super(problems.length <= 5 ? problems.join('; ') : `${problems.slice(0, 5).join('; ')}; and ${problems.length - 5} more problems`);
  }
}

/** The value of a cell as given, for a message. */
const shown = (v: string) => (v === '' ? 'empty' : JSON.stringify(v).length > 40 ? `${JSON.stringify(v).slice(0, 37)}…"` : v);

/** Range of each numeric column, for messages worded on the value ("lat 95 is outside -90..90"). */
const NUMERIC: Record<string, [number, number, boolean]> = {
  lon: [-180, 180, false], lat: [-90, 90, false], altitudeM: [-1000, 20_000, false],
  yawDeg: [-360, 360, true], pitchDeg: [-90, 90, true], rollDeg: [-90, 90, true], focalLengthMm: [0.5, 2000, true],
};

/**
 * Reads a CSV photo log (comma-separated, first line the header, UTF-8; a byte-order mark is ignored). Every row
 * is checked; a bad log throws `PhotoLogError` listing each problem as "row N: what is wrong; fix the photo log".
 */
export function parsePhotoLogCsv(text: string): PhotoRecord[] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const rows = parsed.data;
  if (rows.length === 0) throw new PhotoLogError(['the photo log is empty; it needs the header row `' + PHOTO_LOG_COLUMNS.join(',') + '` and one row per photo']);
  const header = rows[0].map((h) => h.trim());
  const known = [...PHOTO_LOG_COLUMNS, ...PHOTO_LOG_OPTIONAL_COLUMNS] as string[];
  const missing = PHOTO_LOG_COLUMNS.filter((c) => !header.includes(c));
  const unknown = header.filter((h) => !known.includes(h));
  if (missing.length > 0 || unknown.length > 0) {
    const parts: string[] = [];
    if (missing.length) parts.push(`missing column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}`);
    if (unknown.length) parts.push(`unknown column${unknown.length > 1 ? 's' : ''} ${unknown.map(shown).join(', ')}`);
    throw new PhotoLogError([`row 1 (header): ${parts.join('; ')}; the header must be \`${PHOTO_LOG_COLUMNS.join(',')}\` (optionally followed by ${PHOTO_LOG_OPTIONAL_COLUMNS.join(', ')})`]);
  }
  if (rows.length - 1 > MAX_PHOTO_LOG_ROWS) throw new PhotoLogError([`the photo log has ${rows.length - 1} photos, more than the ${MAX_PHOTO_LOG_ROWS} one log takes; split it by flight`]);
  if (rows.length === 1) throw new PhotoLogError(['the photo log has a header but no photos']);
  const problems: string[] = [];
  const out: PhotoRecord[] = [];
  const seen = new Map<string, number>();
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r];
    const rowNo = r + 1;
    const rowProblems: string[] = [];
    if (row.length !== header.length) {
      problems.push(`row ${rowNo}: ${row.length} cells where the header has ${header.length}; fix the photo log`);
      continue;
    }
    const cell = (name: string) => { const i = header.indexOf(name); return i < 0 ? '' : row[i].trim(); };
    const rec: Record<string, unknown> = { file: cell('file'), altitudeRef: cell('altitudeRef'), time: cell('time') };
    for (const [name, [min, max, optional]] of Object.entries(NUMERIC)) {
      const v = cell(name);
      if (v === '') {
        if (!optional) rowProblems.push(`${name} is empty`);
        else if (name !== 'focalLengthMm') rec[name] = null;
        continue;
      }
      const x = Number(v);
      if (!Number.isFinite(x)) rowProblems.push(`${name} ${shown(v)} is not a number`);
      else if (x < min || x > max) rowProblems.push(`${name} ${v} is outside ${min}..${max}`);
      else rec[name] = x;
    }
    const model = cell('cameraModel');
    if (model !== '') rec.cameraModel = model;
    if (!(altitudeRefs as readonly string[]).includes(cell('altitudeRef'))) rowProblems.push(`altitudeRef ${shown(cell('altitudeRef'))} is not one of ${altitudeRefs.join(', ')}`);
    if (rowProblems.length === 0) {
      const ok = photoRecordSchema.safeParse(rec);
      if (!ok.success) {
        for (const issue of ok.error.issues) {
          const name = issue.path.join('.') || 'row';
          rowProblems.push(`${issue.message.startsWith(name) ? '' : `${name}: `}${issue.message}${name === 'time' ? ` (got ${shown(cell('time'))})` : ''}`);
        }
      } else {
        const prev = seen.get(ok.data.file);
        if (prev !== undefined) rowProblems.push(`file ${shown(ok.data.file)} is listed again (first in row ${prev})`);
        else { seen.set(ok.data.file, rowNo); out.push(ok.data); }
      }
    }
    for (const p of rowProblems) problems.push(`row ${rowNo}: ${p}; fix the photo log`);
  }
  if (problems.length > 0) throw new PhotoLogError(problems);
  return out;
}

/** A photo log as CSV text (the same columns the reader takes; optional columns only when some record has them). */
export function photoLogToCsv(records: readonly PhotoRecord[]): string {
  const withLens = records.some((r) => r.focalLengthMm !== undefined || r.cameraModel !== undefined);
  const fields = withLens ? [...PHOTO_LOG_COLUMNS, ...PHOTO_LOG_OPTIONAL_COLUMNS] : [...PHOTO_LOG_COLUMNS];
  const data = records.map((r) => fields.map((f) => { const v = (r as Record<string, unknown>)[f]; return v === null || v === undefined ? '' : String(v); }));
  return `${Papa.unparse({ fields, data }, { newline: '\n' })}\n`;
}
