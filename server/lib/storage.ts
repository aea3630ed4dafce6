// Where originals, previews, contact sheets and bundles live. A folder by default; the interface is
// small enough for an S3-compatible object store to implement (put a stream, read a stream, stat,
// remove, and a local path for the image tools, which an object store would fetch to a temp file).
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Transform, type Readable } from 'node:stream';
import { env } from './env';

export interface PutResult {
  sizeBytes: number;
  sha256: string;
  /** The stream ran past maxBytes: the rest was read and dropped, and nothing may be committed. */
  overLimit: boolean;
}

export interface FileStore {
  /** Streams into a temporary name, hashing on the way; `commit` renames it into place. */
  putStream(stream: Readable, opts?: { maxBytes?: number }): Promise<{ result: PutResult; commit: (key: string) => Promise<void>; discard: () => Promise<void> }>;
  createReadStream(key: string): Readable;
  localPath(key: string): string;
  /** A local path to write a derived file to (previews, sheets, bundles); its folder exists. */
  localPathForWrite(key: string): Promise<string>;
  exists(key: string): Promise<boolean>;
  remove(key: string): Promise<void>;
}

export class TooLarge extends Error {}

/** Keys are relative paths made only of [A-Za-z0-9._/-]; anything else is a programming error. */
function checkKey(key: string) {
  if (!/^[A-Za-z0-9][A-Za-z0-9._/-]*$/.test(key) || key.includes('..')) throw new Error(`bad storage key ${key}`);
}

export function folderStore(root: string): FileStore {
  const tmpDir = path.join(root, '.incoming');
  const abs = (key: string) => {
    checkKey(key);
    return path.join(root, key);
  };
  return {
    async putStream(stream, opts = {}) {
      fs.mkdirSync(tmpDir, { recursive: true });
      const tmp = path.join(tmpDir, `${crypto.randomUUID()}.part`);
      const hash = crypto.createHash('sha256');
      let sizeBytes = 0;
      let overLimit = false;
      // Past the limit the rest is read and dropped, so one oversized file in a multipart request
      // does not stop the files after it.
      const meter = new Transform({
        transform(chunk: Buffer, _enc, cb) {
          sizeBytes += chunk.length;
          if (opts.maxBytes !== undefined && sizeBytes > opts.maxBytes) overLimit = true;
          if (overLimit) return cb();
          hash.update(chunk);
          cb(null, chunk);
        },
      });
      try {
        await pipeline(stream, meter, fs.createWriteStream(tmp, { flags: 'wx' }));
      } catch (err) {
        await fs.promises.rm(tmp, { force: true });
        throw err;
      }
      const result = { sizeBytes, sha256: hash.digest('hex'), overLimit };
      return {
        result,
        commit: async (key) => {
          if (overLimit) throw new TooLarge('refusing to commit a file that ran past its size limit');
          const dest = abs(key);
          await fs.promises.mkdir(path.dirname(dest), { recursive: true });
          await fs.promises.rename(tmp, dest);
        },
        discard: () => fs.promises.rm(tmp, { force: true }),
      };
    },
    createReadStream: (key) => fs.createReadStream(abs(key)),
    localPath: abs,
    async localPathForWrite(key) {
      const p = abs(key);
      await fs.promises.mkdir(path.dirname(p), { recursive: true });
      return p;
    },
    exists: (key) => fs.promises.access(abs(key)).then(() => true, () => false),
    remove: (key) => fs.promises.rm(abs(key), { force: true }),
  };
}

let store: FileStore | undefined;
export function getStore(): FileStore {
  store ??= folderStore(path.resolve(env().LAMELLA_DATA_DIR));
  return store;
}
export function resetStore() {
  store = undefined;
}

export const storageKeys = {
  original: (sessionId: string, sha256: string) => `sessions/${sessionId}/originals/${sha256.slice(0, 2)}/${sha256}`,
  preview: (sessionId: string, frameId: string, size: 'small' | 'large') => `sessions/${sessionId}/previews/${frameId}-${size}.jpg`,
};
