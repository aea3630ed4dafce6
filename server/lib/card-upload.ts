// A multer storage engine for card files: peeks at the first bytes to decide by content what the
// file is, streams it to storage while hashing (never the whole file in memory), and hands the
// stored temp file to the caller. A refused file is drained and reported; the request goes on.
import { Readable } from 'node:stream';
import type { Request } from 'express';
import multer from 'multer';
import { getStore, type PutResult } from './storage';
import { SNIFF_BYTES, sniffImageKind, type SniffResult } from './sniff';

export interface ReceivedCardFile {
  outcome: 'received' | 'refused';
  reason?: string;
  sniff?: Extract<SniffResult, { ok: true }>;
  put?: PutResult;
  commit?: (key: string) => Promise<void>;
  discard?: () => Promise<void>;
}

async function peek(stream: Readable, bytes: number): Promise<{ head: Buffer; rest: Readable }> {
  const chunks: Buffer[] = [];
  let length = 0;
  const iterator = stream[Symbol.asyncIterator]();
  while (length < bytes) {
    const { value, done } = await iterator.next();
    if (done) break;
    chunks.push(value as Buffer);
    length += (value as Buffer).length;
  }
  const head = Buffer.concat(chunks);
  async function* all() {
    yield head;
    for (let r = await iterator.next(); !r.done; r = await iterator.next()) yield r.value as Buffer;
  }
  return { head, rest: Readable.from(all(), { objectMode: false }) };
}

async function drain(stream: Readable) {
  for await (const _ of stream) void _;
}

export function cardStorageEngine(maxBytes: () => number): multer.StorageEngine {
  return {
    _handleFile(_req: Request, file, cb) {
      (async (): Promise<ReceivedCardFile> => {
        const { head, rest } = await peek(file.stream, SNIFF_BYTES);
        const sniff = await sniffImageKind(new Uint8Array(head.buffer, head.byteOffset, Math.min(head.length, SNIFF_BYTES)));
        if (!sniff.ok) {
          await drain(rest);
          return { outcome: 'refused', reason: sniff.reason };
        }
        const { result, commit, discard } = await getStore().putStream(rest, { maxBytes: maxBytes() });
        if (result.overLimit) {
          await discard();
          return { outcome: 'refused', reason: `larger than the upload limit of ${Math.round(maxBytes() / 1e6)} MB` };
        }
        return { outcome: 'received', sniff, put: result, commit, discard };
      })().then(
        (info) => cb(null, info as unknown as Partial<Express.Multer.File>),
        (err: Error) => cb(err),
      );
    },
    _removeFile(_req, file, cb) {
      const received = file as unknown as ReceivedCardFile;
      (received.discard?.() ?? Promise.resolve()).then(() => cb(null), cb);
    },
  };
}

/** The same steps for a file already in memory (the demo seed, scripts): sniff, then store. */
export async function receiveBuffer(data: Buffer, maxBytes: number): Promise<ReceivedCardFile> {
  const sniff = await sniffImageKind(new Uint8Array(data.buffer, data.byteOffset, Math.min(data.length, SNIFF_BYTES)));
  if (!sniff.ok) return { outcome: 'refused', reason: sniff.reason };
  const { result, commit, discard } = await getStore().putStream(Readable.from([data]), { maxBytes });
  if (result.overLimit) {
    await discard();
    return { outcome: 'refused', reason: 'larger than the upload limit' };
  }
  return { outcome: 'received', sniff, put: result, commit, discard };
}
