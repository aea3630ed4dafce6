import { randomBytes } from 'node:crypto';
import { createWriteStream, type WriteStream } from 'node:fs';
import { open, rename, rm } from 'node:fs/promises';
import { finished } from 'node:stream/promises';

// A reader of outPath sees either nothing or a finished file: data goes to a sibling
// `<name>.part-<random>` (same folder, so the rename is atomic) and is renamed when complete.
export function tempPathFor(outPath: string): string {
  return `${outPath}.part-${randomBytes(6).toString('hex')}`;
}

async function fsyncFile(path: string): Promise<void> {
  const handle = await open(path, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

export async function writeFileAtomic(outPath: string, data: Buffer | Uint8Array | string): Promise<void> {
  const tempPath = tempPathFor(outPath);
  try {
    const handle = await open(tempPath, 'wx');
    try {
      await handle.writeFile(data);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(tempPath, outPath);
  } catch (error) {
    await rm(tempPath, { force: true });
    throw error;
  }
}

export interface AtomicWriteStream {
  stream: WriteStream;
  tempPath: string;
  /** Waits for the stream to finish, flushes it to disk and renames it to outPath. */
  commit(): Promise<void>;
  /** Destroys the stream and removes the temporary file; safe to call more than once. */
  abort(): Promise<void>;
}

export function createAtomicWriteStream(outPath: string): AtomicWriteStream {
  const tempPath = tempPathFor(outPath);
  const stream = createWriteStream(tempPath, { flags: 'wx' });
  let settled = false;
  // Without a listener an early error (e.g. a missing folder) would crash the process;
  // `finished()` in commit/abort still reports it.
  stream.on('error', () => undefined);

  const abort = async (): Promise<void> => {
    settled = true;
    if (!stream.destroyed) stream.destroy();
    await finished(stream).catch(() => undefined);
    await rm(tempPath, { force: true });
  };

  const commit = async (): Promise<void> => {
    if (settled) throw new Error(`atomic write of ${outPath} was already committed or aborted`);
    settled = true;
    try {
      if (!stream.writableEnded) stream.end();
      await finished(stream);
      await fsyncFile(tempPath);
      await rename(tempPath, outPath);
    } catch (error) {
      await rm(tempPath, { force: true });
      throw error;
    }
  };

  return { stream, tempPath, commit, abort };
}
