import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDiskStorage } from '../../server/storage/disk-storage';
import { createS3Storage } from '../../server/storage/s3-storage';
import { StorageLimitError, StorageNotFoundError, type Storage } from '../../server/storage/storage';

// SHA-256("abc"): FIPS 180-2, appendix B.1 (one-block message example).
const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

/** A stream that never ends: only a limit enforced while streaming can stop it. */
function endless(chunkBytes = 64 * 1024): Readable {
  const chunk = Buffer.alloc(chunkBytes, 7);
  return new Readable({ read() { this.push(chunk); } });
}

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-storage-'));
let s3: S3rver;
let s3Endpoint: string;

beforeAll(async () => {
  s3 = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: path.join(tmpRoot, 's3rver'), configureBuckets: [{ name: 'loftline-test' }] });
  const addr = (await s3.run()) as { port: number };
  s3Endpoint = `http://127.0.0.1:${addr.port}`;
});
afterAll(async () => {
  await s3?.close();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

const drivers: Array<[string, () => Storage]> = [
  ['disk', () => createDiskStorage(path.join(tmpRoot, 'disk'))],
  // s3rver accepts its built-in key pair S3RVER / S3RVER; a 5 MiB part size exercises the multipart path
  ['s3 (s3rver)', () => createS3Storage({ endpoint: s3Endpoint, bucket: 'loftline-test', region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', partBytes: 5 * 2 ** 20 })],
];

describe.each(drivers)('%s storage', (_name, make) => {
  let store: Storage;
  beforeAll(() => {
    store = make();
  });

  it('stores bytes and reports the SHA-256 of the published example', async () => {
    const r = await store.put('t/abc.txt', Buffer.from('abc'));
    expect(r).toEqual({ sizeBytes: 3, sha256: ABC_SHA256 });
    expect((await store.getBytes('t/abc.txt')).toString()).toBe('abc');
    expect(await store.exists('t/abc.txt')).toBe(true);
  });

  it('streams a file larger than one upload part and reads it back intact', async () => {
    const bytes = crypto.randomBytes(11 * 2 ** 20 + 123);
    const source = Readable.from((function* () {
      for (let i = 0; i < bytes.length; i += 100_000) yield bytes.subarray(i, i + 100_000);
    })());
    const r = await store.put('t/big.bin', source, { limitBytes: 12 * 2 ** 20 });
    expect(r.sizeBytes).toBe(bytes.length);
    expect(r.sha256).toBe(crypto.createHash('sha256').update(bytes).digest('hex'));
    const back = await store.getBytes('t/big.bin');
    expect(back.equals(bytes)).toBe(true);
    const streamed: Buffer[] = [];
    for await (const c of await store.getStream('t/big.bin')) streamed.push(c as Buffer);
    expect(Buffer.concat(streamed).equals(bytes)).toBe(true);
  });

  it('stops an endless upload at the limit and leaves nothing under the key', async () => {
    await expect(store.put('t/endless.bin', endless(), { limitBytes: 6 * 2 ** 20 })).rejects.toBeInstanceOf(StorageLimitError);
    expect(await store.exists('t/endless.bin')).toBe(false);
    expect(await store.list('t/endless')).toEqual([]);
  });

  it('accepts a file of exactly the limit', async () => {
    const r = await store.put('t/exact.bin', Buffer.alloc(1000, 1), { limitBytes: 1000 });
    expect(r.sizeBytes).toBe(1000);
  });

  it('lists keys under a prefix and deletes them', async () => {
    await store.put('list/a/1.txt', Buffer.from('1'));
    await store.put('list/b/2.txt', Buffer.from('2'));
    expect(await store.list('list/')).toEqual(['list/a/1.txt', 'list/b/2.txt']);
    await store.delete('list/a/1.txt');
    await store.delete('list/a/1.txt'); // deleting twice is fine
    expect(await store.list('list/')).toEqual(['list/b/2.txt']);
  });

  it('answers a missing key with StorageNotFoundError', async () => {
    await expect(store.getBytes('t/nothing-here')).rejects.toBeInstanceOf(StorageNotFoundError);
    expect(await store.exists('t/nothing-here')).toBe(false);
  });

  it('reads a stored grid by ranges: a local file, or ranged GETs (no whole-object read)', async () => {
    const bytes = crypto.randomBytes(300_000);
    await store.put('t/ranges.bin', bytes);
    const local = store.localPath ? await store.localPath('t/ranges.bin') : null;
    if (local) {
      expect(store.driver).toBe('disk');
      expect(fs.readFileSync(local).equals(bytes)).toBe(true);
      await expect(store.localPath!('t/nothing-here')).rejects.toBeInstanceOf(StorageNotFoundError);
      return;
    }
    expect(store.driver).toBe('s3');
    const ranges = await store.openRanges!('t/ranges.bin');
    expect(ranges.byteLength).toBe(bytes.length);
    expect(Buffer.from(await ranges.read(0, 8)).equals(bytes.subarray(0, 8))).toBe(true);
    expect(Buffer.from(await ranges.read(123_456, 70_000)).equals(bytes.subarray(123_456, 193_456))).toBe(true);
    // past the end: fewer bytes, as a slice would give
    expect(Buffer.from(await ranges.read(299_990, 100)).equals(bytes.subarray(299_990))).toBe(true);
    expect((await ranges.read(300_000, 10)).byteLength).toBe(0);
    await expect(store.openRanges!('t/nothing-here')).rejects.toBeInstanceOf(StorageNotFoundError);
  });

  it('refuses keys that could leave the store', async () => {
    await expect(store.put('../escape.txt', Buffer.from('x'))).rejects.toThrow(/Invalid storage key/);
    await expect(store.put('a//b', Buffer.from('x'))).rejects.toThrow(/Invalid storage key/);
  });
});

describe('disk storage', () => {
  it('leaves no temporary part file after a refused upload', async () => {
    const root = path.join(tmpRoot, 'disk-tmp');
    const store = createDiskStorage(root);
    await expect(store.put('x/y.bin', endless(), { limitBytes: 100_000 })).rejects.toBeInstanceOf(StorageLimitError);
    expect(fs.readdirSync(path.join(root, '.tmp'))).toEqual([]);
    expect(fs.existsSync(path.join(root, 'x'))).toBe(false);
  });
});
