/** Object storage for uploads and derived files: one interface, a local-disk driver and an S3-compatible driver. */
import crypto from 'node:crypto';
import { Readable, Transform, type TransformCallback } from 'node:stream';
import { formatBytes } from '../../contracts/format/bytes';

/** What `put` measured while the bytes streamed through. */
interface PutResult {
  sizeBytes: number;
  /** Lower-case hex SHA-256 of the stored bytes. */
  sha256: string;
}

interface PutOptions {
  /** Refuse (and store nothing) once more than this many bytes have streamed. */
  limitBytes?: number;
  contentType?: string;
}

/** A store of immutable objects named by keys such as `teams/<team>/sites/<id>/dem.tif`. */
export interface Storage {
  /** Which driver this is, for logs and health. */
  readonly driver: 'disk' | 's3';
  /** Stream `body` into `key`, hashing and counting on the way; on any failure nothing is left under `key`. */
  put(key: string, body: Readable | Uint8Array, opts?: PutOptions): Promise<PutResult>;
  getBytes(key: string): Promise<Buffer>;
  /**
   * The object as a local file that terrain threads can read by ranges (disk storage), or null when the store has
   * no local files (S3: read with getBytes). Throws StorageNotFoundError for a missing key.
   */
  localPath?(key: string): Promise<string | null>;
  /** The object read by byte ranges (S3: ranged GETs); reads past the end answer fewer bytes. */
  openRanges?(key: string): Promise<{ byteLength: number; read(offset: number, length: number): Promise<Uint8Array> }>;
  getStream(key: string): Promise<Readable>;
  /** Remove `key`; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
  exists(key: string): Promise<boolean>;
  /** Keys under `prefix` (tests check that refused uploads left nothing behind). */
  list(prefix?: string): Promise<string[]>;
  /** When `key` was last written, or null when it is missing. */
  modifiedAt(key: string): Promise<Date | null>;
  /** Remove partial writes older than `olderThanMs` that a crash left behind; returns what was removed. */
  sweepPartial(olderThanMs: number): Promise<string[]>;
}

/** The upload went past its size limit; carries the limit for the error message. */
export class StorageLimitError extends Error {
  readonly code = 'LIMIT_FILE_SIZE';
  constructor(readonly limitBytes: number) {
    super(`The file is larger than the upload limit of ${formatBytes(limitBytes, 'limit')}.`);
    this.name = 'StorageLimitError';
  }
}

/** A key missing from the store. */
export class StorageNotFoundError extends Error {
  constructor(readonly key: string) {
    super(`No stored object ${key}.`);
    this.name = 'StorageNotFoundError';
  }
}

/** A pass-through that hashes and counts, failing with StorageLimitError as soon as the count passes `limitBytes`. */
export class MeterStream extends Transform {
  private readonly hash = crypto.createHash('sha256');
  sizeBytes = 0;
  constructor(private readonly limitBytes = Infinity) {
    super();
  }
  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    this.sizeBytes += chunk.length;
    if (this.sizeBytes > this.limitBytes) return done(new StorageLimitError(this.limitBytes));
    this.hash.update(chunk);
    done(null, chunk);
  }
  /** The digest, once the stream has ended. */
  digest(): PutResult {
    return { sizeBytes: this.sizeBytes, sha256: this.hash.digest('hex') };
  }
}

/** Readable for either input form of `put`. */
export function toReadable(body: Readable | Uint8Array): Readable {
  return body instanceof Uint8Array ? Readable.from([Buffer.from(body.buffer, body.byteOffset, body.byteLength)]) : body;
}

/** Keys are relative, slash-separated, without `..` or empty parts, so no driver can be led outside its root. */
export function checkKey(key: string): string {
  if (!/^[A-Za-z0-9._-]+(\/[A-Za-z0-9._-]+)*$/.test(key) || key.split('/').some((p) => p === '.' || p === '..')) {
    throw new Error(`Invalid storage key ${JSON.stringify(key)}.`);
  }
  return key;
}
