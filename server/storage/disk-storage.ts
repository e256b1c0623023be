/** Storage on the local disk: objects are files under one root folder, written to a temporary name then renamed. */
import crypto from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { checkKey, MeterStream, StorageNotFoundError, toReadable, type Storage } from './storage';

const TMP_DIR = '.tmp';

/** Rename `tmp` to `target`, making its folder; retried once because a concurrent delete may prune the folder. */
async function moveInto(tmp: string, target: string): Promise<void> {
  for (let attempt = 0; ; attempt++) {
    await fsp.mkdir(path.dirname(target), { recursive: true });
    try {
      return await fsp.rename(tmp, target);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'ENOENT' || attempt > 0) throw err;
    }
  }
}

/** A disk store rooted at `root` (created when missing). */
export function createDiskStorage(root: string): Storage {
  const abs = path.resolve(root);
  const file = (key: string) => path.join(abs, ...checkKey(key).split('/'));

  async function walk(dir: string, rel: string, out: string[]): Promise<void> {
    let entries: fs.Dirent[];
    try {
      entries = await fsp.readdir(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      if (!rel && e.name === TMP_DIR) continue;
      const r = rel ? `${rel}/${e.name}` : e.name;
      if (e.isDirectory()) await walk(path.join(dir, e.name), r, out);
      else out.push(r);
    }
  }

  return {
    driver: 'disk',

    async put(key, body, opts = {}) {
      const target = file(key);
      const tmpDir = path.join(abs, TMP_DIR);
      await fsp.mkdir(tmpDir, { recursive: true });
      // write beside the store and rename: a crash or a refused upload never leaves a half file under the key
      const tmp = path.join(tmpDir, `${crypto.randomUUID()}.part`);
      const meter = new MeterStream(opts.limitBytes);
      try {
        await pipeline(toReadable(body), meter, fs.createWriteStream(tmp, { flags: 'wx' }));
        await moveInto(tmp, target);
      } catch (err) {
        await fsp.rm(tmp, { force: true });
        throw err;
      }
      return meter.digest();
    },

    async getBytes(key) {
      try {
        return await fsp.readFile(file(key));
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') throw new StorageNotFoundError(key);
        throw err;
      }
    },

    async localPath(key) {
      const f = file(key);
      try {
        await fsp.access(f, fs.constants.R_OK);
      } catch {
        throw new StorageNotFoundError(key);
      }
      return f;
    },

    async getStream(key) {
      const f = file(key);
      if (!fs.existsSync(f)) throw new StorageNotFoundError(key);
      return fs.createReadStream(f);
    },

    async delete(key) {
      const f = file(key);
      await fsp.rm(f, { force: true });
      // tidy empty folders up to the root so a deleted site leaves no trace
      let dir = path.dirname(f);
      while (dir.startsWith(abs + path.sep)) {
        try {
          await fsp.rmdir(dir);
        } catch {
          break;
        }
        dir = path.dirname(dir);
      }
    },

    async exists(key) {
      return fs.existsSync(file(key));
    },

    async list(prefix = '') {
      const out: string[] = [];
      await walk(abs, '', out);
      return out.filter((k) => k.startsWith(prefix)).sort();
    },

    async modifiedAt(key) {
      try {
        return (await fsp.stat(file(key))).mtime;
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw err;
      }
    },

    async sweepPartial(olderThanMs) {
      // .part files of puts that never finished: the process died between the first byte and the rename
      const tmpDir = path.join(abs, TMP_DIR);
      const names = await fsp.readdir(tmpDir).catch(() => [] as string[]);
      const removed: string[] = [];
      for (const name of names) {
        if (!name.endsWith('.part')) continue;
        const f = path.join(tmpDir, name);
        const st = await fsp.stat(f).catch(() => null);
        if (st && Date.now() - st.mtimeMs > olderThanMs) {
          await fsp.rm(f, { force: true });
          removed.push(`${TMP_DIR}/${name}`);
        }
      }
      return removed;
    },
  };
}
