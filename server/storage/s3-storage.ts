/**
 * Storage in an S3-compatible bucket through @aws-sdk/client-s3. Uploads stream in parts of `partBytes`
 * (multipart upload), so memory stays bounded whatever the file size; a failed or refused upload is aborted.
 */
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  UploadPartCommand,
  type CompletedPart,
} from '@aws-sdk/client-s3';
import { Readable } from 'node:stream';
import { checkKey, MeterStream, StorageNotFoundError, toReadable, type Storage } from './storage';

interface S3StorageConfig {
  endpoint?: string;
  bucket: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  /** Path-style URLs (http://host/bucket/key), which local S3 servers need. Default true. */
  forcePathStyle?: boolean;
  /** Key prefix inside the bucket, e.g. "loftline/". */
  prefix?: string;
  /** Multipart part size; S3 requires at least 5 MiB for every part but the last. Default 8 MiB. */
  partBytes?: number;
}

const MIN_PART = 5 * 2 ** 20;

function isMissing(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NoSuchKey' || e?.name === 'NotFound' || e?.$metadata?.httpStatusCode === 404;
}

/** Read a stream in chunks of exactly `size` bytes (the last one shorter), copying only at chunk borders. */
async function* chunksOf(stream: AsyncIterable<Buffer>, size: number): AsyncGenerator<Buffer> {
  let parts: Buffer[] = [];
  let held = 0;
  for await (const chunk of stream) {
    let c = chunk;
    while (held + c.length >= size) {
      const take = size - held;
      parts.push(c.subarray(0, take));
      yield Buffer.concat(parts, size);
      parts = [];
      held = 0;
      c = c.subarray(take);
    }
    if (c.length) {
      parts.push(c);
      held += c.length;
    }
  }
  if (held > 0) yield Buffer.concat(parts, held);
}

/** An S3 store; the bucket must exist. */
export function createS3Storage(cfg: S3StorageConfig): Storage {
  const client = new S3Client({
    endpoint: cfg.endpoint,
    region: cfg.region,
    forcePathStyle: cfg.forcePathStyle ?? true,
    credentials: cfg.accessKeyId && cfg.secretAccessKey ? { accessKeyId: cfg.accessKeyId, secretAccessKey: cfg.secretAccessKey } : undefined,
    // plain Content-MD5-free requests: S3-compatible servers differ in support for the newer checksum headers
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = cfg.bucket;
  const prefix = cfg.prefix ?? '';
  const partBytes = Math.max(cfg.partBytes ?? 8 * 2 ** 20, MIN_PART);
  const full = (key: string) => prefix + checkKey(key);

  async function getStream(key: string): Promise<Readable> {
    try {
      const r = await client.send(new GetObjectCommand({ Bucket, Key: full(key) }));
      return r.Body as Readable;
    } catch (err) {
      if (isMissing(err)) throw new StorageNotFoundError(key);
      throw err;
    }
  }

  /** One ranged GET (RFC 9110 section 14: bytes=first-last, inclusive). */
  async function getRange(key: string, offset: number, length: number): Promise<Uint8Array> {
    try {
      const r = await client.send(new GetObjectCommand({ Bucket, Key: full(key), Range: `bytes=${offset}-${offset + length - 1}` }));
      return await r.Body!.transformToByteArray();
    } catch (err) {
      if (isMissing(err)) throw new StorageNotFoundError(key);
      throw err;
    }
  }

  return {
    driver: 's3',

    async openRanges(key) {
      checkKey(key);
      let byteLength: number;
      try {
        byteLength = (await client.send(new HeadObjectCommand({ Bucket, Key: full(key) }))).ContentLength ?? 0;
      } catch (err) {
        if (isMissing(err)) throw new StorageNotFoundError(key);
        throw err;
      }
      return {
        byteLength,
        async read(offset, length) {
          const n = Math.max(0, Math.min(length, byteLength - offset));
          return n === 0 ? new Uint8Array(0) : getRange(key, offset, n);
        },
      };
    },

    async put(key, body, opts = {}) {
      const Key = full(key);
      const meter = new MeterStream(opts.limitBytes);
      const source = toReadable(body);
      source.on('error', (e) => meter.destroy(e));
      source.pipe(meter);
      let uploadId: string | undefined;
      const done: CompletedPart[] = [];
      try {
        for await (const part of chunksOf(meter, partBytes)) {
          if (!uploadId && part.length < partBytes) {
            // the whole object fits in one part: a single PUT
            await client.send(new PutObjectCommand({ Bucket, Key, Body: part, ContentLength: part.length, ContentType: opts.contentType }));
            return meter.digest();
          }
          if (!uploadId) {
            const c = await client.send(new CreateMultipartUploadCommand({ Bucket, Key, ContentType: opts.contentType }));
            uploadId = c.UploadId!;
          }
          const PartNumber = done.length + 1;
          const r = await client.send(new UploadPartCommand({ Bucket, Key, UploadId: uploadId, PartNumber, Body: part, ContentLength: part.length }));
          done.push({ ETag: r.ETag, PartNumber });
        }
        if (!uploadId) {
          await client.send(new PutObjectCommand({ Bucket, Key, Body: Buffer.alloc(0), ContentLength: 0, ContentType: opts.contentType }));
        } else {
          await client.send(new CompleteMultipartUploadCommand({ Bucket, Key, UploadId: uploadId, MultipartUpload: { Parts: done } }));
        }
        return meter.digest();
      } catch (err) {
        // like stream.pipeline: a failed store destroys its input (the caller decides how to answer the client)
        source.unpipe(meter);
        source.destroy();
        if (uploadId) await client.send(new AbortMultipartUploadCommand({ Bucket, Key, UploadId: uploadId })).catch(() => undefined);
        throw err;
      }
    },

    async getBytes(key) {
      const s = await getStream(key);
      const chunks: Buffer[] = [];
      for await (const c of s) chunks.push(c as Buffer);
      return Buffer.concat(chunks);
    },

    getStream,

    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: full(key) }));
    },

    async exists(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key: full(key) }));
        return true;
      } catch (err) {
        if (isMissing(err)) return false;
        throw err;
      }
    },

    async list(p = '') {
      const out: string[] = [];
      let ContinuationToken: string | undefined;
      do {
        const r = await client.send(new ListObjectsV2Command({ Bucket, Prefix: prefix + p, ContinuationToken }));
        for (const o of r.Contents ?? []) if (o.Key) out.push(o.Key.slice(prefix.length));
        ContinuationToken = r.IsTruncated ? r.NextContinuationToken : undefined;
      } while (ContinuationToken);
      return out.sort();
    },

    async modifiedAt(key) {
      try {
        return (await client.send(new HeadObjectCommand({ Bucket, Key: full(key) }))).LastModified ?? null;
      } catch (err) {
        if (isMissing(err)) return null;
        throw err;
      }
    },

    async sweepPartial() {
      // a single PUT is all or nothing in S3: a crash mid-upload leaves no object behind
      return [];
    },
  };
}
