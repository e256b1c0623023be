/**
 * Multipart reception of a DEM: multer parses the form and hands the file stream to a storage engine that streams
 * it straight into Loftline's storage, hashing and counting on the way and stopping at the upload limit.
 */
import { PassThrough } from 'node:stream';
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { siteFileField } from '../../contracts/sites';
import { errors } from '../http/errors';
import { siteErrors } from './sites.errors';
import { formatBytes } from '../../contracts/format/bytes';
import { StorageLimitError, type Storage } from '../storage/storage';

/** What the engine records about the stored file. */
export interface ReceivedFile {
  originalname: string;
  storageKey: string;
  size: number;
  sha256: string;
}

/** Per-request storage key of the upload, decided before the body is read. */
const keys = new WeakMap<Request, string>();

/** Set where this request's file will be stored (call before the upload middleware). */
export function setUploadKey(req: Request, key: string): void {
  keys.set(req, key);
}

function engine(storage: Storage, limitBytes: number): multer.StorageEngine {
  return {
    _handleFile(req, file, cb) {
      const key = keys.get(req);
      if (!key) return cb(new Error('setUploadKey was not called before the upload middleware.'));
      // A pass-through between multer's stream and storage: a refused store destroys only the pass-through, so
      // multer hears of the failure from our callback, after the store has removed its partial file.
      const pass = new PassThrough();
      file.stream.on('error', (err) => pass.destroy(err));
      file.stream.pipe(pass);
      storage.put(key, pass, { limitBytes, contentType: 'image/tiff' }).then(
        (r) => cb(null, { storageKey: key, size: r.sizeBytes, sha256: r.sha256 } as Partial<Express.Multer.File>),
        (err) => {
          file.stream.unpipe(pass);
          file.stream.resume();
          cb(err);
        },
      );
    },
    _removeFile(_req, file, cb) {
      const key = (file as unknown as ReceivedFile).storageKey;
      if (!key) return cb(null);
      storage.delete(key).then(() => cb(null), cb);
    },
  };
}

/** multer's error codes as API errors with a message for a person. */
function uploadError(err: unknown, limitBytes: number): unknown {
  if (err instanceof StorageLimitError) return errors.too_large(`The file is larger than the upload limit of ${formatBytes(limitBytes, 'limit')}; crop or resample the DEM (gdal_translate -projwin / -tr) and try again.`);
  if (err instanceof multer.MulterError) {
    switch (err.code) {
      case 'LIMIT_FILE_COUNT':
      case 'LIMIT_UNEXPECTED_FILE':
        return errors.invalid(`Send one DEM file, in the form part named "${siteFileField}".`, [{ path: siteFileField, message: 'One GeoTIFF file, in this part only.' }]);
      default:
        return errors.invalid(`The upload form is not valid (${err.message}).`);
    }
  }
  if (err instanceof Error && /Unexpected end of form|Request aborted|Request closed|Malformed part header/i.test(err.message)) {
    return siteErrors.upload_incomplete();
  }
  return err;
}

/** Middleware that receives one file into `storage` (at the key set by setUploadKey) and the text fields into req.body. */
export function receiveDemUpload(storage: Storage, limitBytes: number): RequestHandler {
  const upload = multer({ storage: engine(storage, limitBytes), limits: { files: 1, fields: 20, fieldSize: 16 * 1024, parts: 24 } }).single(siteFileField);
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      return next(errors.unsupported_media_type(`Send the DEM as multipart/form-data, the file in the part named "${siteFileField}".`));
    }
    upload(req, res, (err?: unknown) => next(err ? uploadError(err, limitBytes) : undefined));
  };
}

/** The file multer received, if any. */
export function receivedFile(req: Request): ReceivedFile | null {
  return (req.file as unknown as ReceivedFile | undefined) ?? null;
}
