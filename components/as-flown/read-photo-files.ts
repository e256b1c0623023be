/**
 * The photo log of the files a crew picks: one CSV photo log, or photos (JPEG/TIFF) whose metadata is read here on
 * the device, a few at a time, from the head of each JPEG (components/photos/read-photo-metadata.ts). Photos that
 * cannot be placed are left out and named; only the records go to the server.
 */
import { PhotoLogError, parsePhotoLogCsv, MAX_PHOTO_LOG_ROWS, type PhotoRecord } from '../../contracts/photo-log';
import { PHOTO_HEAD_BYTES, PhotoMetadataError, readPhotoMetadata } from '../photos/read-photo-metadata';

/** What was read: the records to send, where they came from, and what was left out or assumed (for the crew). */
export interface PhotoLogReading {
  source: 'photos' | 'csv';
  label: string;
  photos: PhotoRecord[];
  /** Files left out, each with why. */
  skipped: string[];
  /** Photos read with an assumption (no attitude in the photo, …): how many, and the first note. */
  assumedCount: number;
}

/** Picked files that give no photo log: says what is wrong and what to pick instead. */
export class PhotoPickError extends Error {}

const isCsv = (f: { name: string }) => /\.csv$/i.test(f.name);
const isTiff = (f: { name: string }) => /\.tiff?$/i.test(f.name);
const isPhoto = (f: { name: string }) => /\.(jpe?g|tiff?)$/i.test(f.name);

/** Folder of the picked photos when the browser gives it (a folder pick), for the label. */
function folderOf(files: readonly File[]): string | null {
  const rel = (files[0] as File & { webkitRelativePath?: string }).webkitRelativePath;
  if (!rel || !rel.includes('/')) return null;
  return rel.slice(0, rel.lastIndexOf('/'));
}

/** Read the picked files; `onProgress(done, total)` after each photo. */
export async function readPhotoFiles(files: readonly File[], onProgress: (done: number, total: number) => void = () => {}): Promise<PhotoLogReading> {
  const csvs = files.filter(isCsv);
  if (csvs.length > 0) {
    if (files.length > 1) throw new PhotoPickError('Pick either one CSV photo log or the photos themselves, not both.');
    let photos: PhotoRecord[];
    try {
      photos = parsePhotoLogCsv(await csvs[0].text());
    } catch (err) {
      if (err instanceof PhotoLogError) throw new PhotoPickError(`${csvs[0].name}: ${err.message}.`);
      throw err;
    }
    return { source: 'csv', label: csvs[0].name, photos, skipped: [], assumedCount: photos.filter((p) => p.yawDeg === null || p.pitchDeg === null || p.rollDeg === null).length };
  }
  const picked = files.filter(isPhoto);
  const skipped = files.filter((f) => !isPhoto(f)).map((f) => `${f.name}: not a JPEG or TIFF photo`);
  if (picked.length === 0) throw new PhotoPickError('None of the picked files is a JPEG or TIFF photo or a CSV photo log. Pick the flight\'s photos (or its CSV log).');
  if (picked.length > MAX_PHOTO_LOG_ROWS) throw new PhotoPickError(`${picked.length} photos picked; one check takes at most ${MAX_PHOTO_LOG_ROWS.toLocaleString('en')}. Check one flight at a time.`);
  const out: (PhotoRecord | null)[] = new Array(picked.length).fill(null);
  let assumedCount = 0;
  let done = 0;
  let next = 0;
  // a few reads at a time: the device's storage, not the CPU, is the limit
  const worker = async () => {
    while (next < picked.length) {
      const k = next++;
      const f = picked[k];
      try {
        const bytes = await (isTiff(f) ? f : f.slice(0, PHOTO_HEAD_BYTES)).arrayBuffer();
        const r = await readPhotoMetadata(bytes, f.name);
        out[k] = r.record;
        if (r.assumed.length) assumedCount++;
      } catch (err) {
        if (!(err instanceof PhotoMetadataError)) throw err;
        skipped.push(err.message);
      }
      onProgress(++done, picked.length);
    }
  };
  await Promise.all(Array.from({ length: 4 }, worker));
  const photos = out.filter((r): r is PhotoRecord => r !== null);
  if (photos.length === 0) throw new PhotoPickError(`No picked photo could be placed: ${skipped.slice(0, 3).join('; ')}${skipped.length > 3 ? ` (and ${skipped.length - 3} more)` : ''}.`);
  const folder = folderOf(picked);
  return { source: 'photos', label: folder ? `photos from ${folder}` : 'photos picked on the device', photos, skipped, assumedCount };
}
