// Runs one card import in the browser: hashes files in small batches and asks the server which it
// holds already (a resumed import skips those), uploads the rest three at a time, one file per
// request, lets failed files be retried, and completes the import when every file is settled.
import { ApiError } from '@/lib/api-client';
import { createImport } from '../api/create-import';
import { checkKnownHashes } from '../api/check-known-hashes';
import { completeImport } from '../api/complete-import';
import { uploadCardFile } from '../api/upload-card-file';
import { canHashInBrowser, sha256OfFile } from './hash-file';
import type { PickedFile } from './picked-files';

export const PARALLEL_UPLOADS = 3;
const HASH_BATCH_FILES = 8;
const EMIT_EVERY_MS = 100;

export type ItemStatus = 'waiting' | 'hashing' | 'queued' | 'uploading' | 'stored' | 'duplicate' | 'skipped' | 'refused' | 'failed';
const SETTLED: ReadonlySet<ItemStatus> = new Set(['stored', 'duplicate', 'skipped', 'refused', 'failed']);

export interface ImportItem {
  key: number;
  path: string;
  sizeBytes: number;
  loadedBytes: number;
  status: ItemStatus;
  /** The refusal reason, the error, or what the server flagged. */
  message: string | null;
}

export type ImportPhase = 'idle' | 'running' | 'needs-attention' | 'finishing' | 'done' | 'error';

export interface ImportSnapshot {
  phase: ImportPhase;
  items: ImportItem[];
  error: string | null;
  hiddenCount: number;
}

const messageOf = (err: unknown) => (err instanceof Error ? err.message : 'Something went wrong.');

export class CardImportEngine {
  private snapshot: ImportSnapshot = { phase: 'idle', items: [], error: null, hiddenCount: 0 };
  private files = new Map<number, File>();
  private listeners = new Set<() => void>();
  private importId: string | null = null;
  private active = 0;
  private emitTimer: ReturnType<typeof setTimeout> | null = null;
  private controller = new AbortController();

  constructor(private readonly studioId: string, private readonly sessionId: string, private readonly onCompleted: () => void) {}

  subscribe = (fn: () => void) => {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  };
  getSnapshot = () => this.snapshot;

  private emit(now = true) {
    if (!now) {
      this.emitTimer ??= setTimeout(() => this.emit(), EMIT_EVERY_MS);
      return;
    }
    if (this.emitTimer) clearTimeout(this.emitTimer);
    this.emitTimer = null;
    this.snapshot = { ...this.snapshot, items: [...this.snapshot.items] };
    this.listeners.forEach((fn) => fn());
  }

  private update(key: number, change: Partial<ImportItem>, now = true) {
    const items = this.snapshot.items;
    const i = items.findIndex((it) => it.key === key);
    if (i >= 0) items[i] = { ...items[i], ...change };
    this.emit(now);
  }

  private set(change: Partial<ImportSnapshot>) {
    this.snapshot = { ...this.snapshot, ...change };
    this.emit();
  }

  async start(picked: PickedFile[], hiddenCount = 0) {
    if (this.snapshot.phase === 'running' || this.snapshot.phase === 'finishing') return;
    this.controller = new AbortController();
    this.files.clear();
    const items = picked.map((p, key): ImportItem => {
      this.files.set(key, p.file);
      return { key, path: p.path, sizeBytes: p.file.size, loadedBytes: 0, status: 'waiting', message: null };
    });
    this.snapshot = { phase: 'running', items, error: null, hiddenCount };
    this.emit();
    try {
      this.importId = (await createImport(this.studioId, this.sessionId, items.length)).id;
      await this.hashAndQueue(items.map((it) => it.key));
    } catch (err) {
      this.set({ phase: 'error', error: messageOf(err) });
    }
  }

  private async hashAndQueue(keys: number[]) {
    if (!canHashInBrowser()) {
      keys.forEach((key) => this.update(key, { status: 'queued' }, false));
      this.pump();
      return;
    }
    for (let i = 0; i < keys.length; i += HASH_BATCH_FILES) {
      if (this.controller.signal.aborted) return;
      const batch = keys.slice(i, i + HASH_BATCH_FILES);
      const sums = new Map<number, string>();
      for (const key of batch) {
        this.update(key, { status: 'hashing' }, false);
        sums.set(key, await sha256OfFile(this.files.get(key)!));
      }
      const known = await checkKnownHashes(this.studioId, this.sessionId, [...sums.values()]);
      for (const key of batch) {
        const file = this.files.get(key)!;
        if (known.has(sums.get(key)!)) this.update(key, { status: 'skipped', loadedBytes: file.size, message: 'already in this session' }, false);
        else this.update(key, { status: 'queued' }, false);
      }
      this.pump();
    }
    this.settleIfDone();
  }

  private pump() {
    while (this.active < PARALLEL_UPLOADS && !this.controller.signal.aborted) {
      const next = this.snapshot.items.find((it) => it.status === 'queued');
      if (!next) break;
      this.active += 1;
      this.update(next.key, { status: 'uploading', loadedBytes: 0, message: null });
      void this.uploadOne(next.key).finally(() => {
        this.active -= 1;
        this.pump();
        this.settleIfDone();
      });
    }
  }

  private async uploadOne(key: number) {
    const file = this.files.get(key)!;
    try {
      const outcome = await uploadCardFile(this.studioId, this.sessionId, this.importId!, file, {
        onProgress: (loadedBytes) => this.update(key, { loadedBytes }, false),
        signal: this.controller.signal,
      });
      if (outcome.status === 'refused') this.update(key, { status: 'refused', loadedBytes: file.size, message: outcome.reason });
      else if (outcome.status === 'duplicate') this.update(key, { status: 'duplicate', loadedBytes: file.size, message: 'same content as a file already stored' });
      else this.update(key, { status: 'stored', loadedBytes: file.size, message: outcome.flags.length ? outcome.flags.join(', ') : null });
    } catch (err) {
      const stopped = err instanceof ApiError && err.code === 'aborted';
      this.update(key, { status: 'failed', loadedBytes: 0, message: stopped ? 'stopped before it was stored' : messageOf(err) });
    }
  }

  private settleIfDone() {
    const items = this.snapshot.items;
    if (this.snapshot.phase !== 'running' || this.active > 0 || !items.every((it) => SETTLED.has(it.status))) return;
    if (items.some((it) => it.status === 'failed')) this.set({ phase: 'needs-attention' });
    else void this.finish();
  }

  /** Ends the import with what is stored; failed files can be imported again later. */
  async finish() {
    if (!this.importId) return;
    this.set({ phase: 'finishing' });
    try {
      await completeImport(this.studioId, this.sessionId, this.importId);
      this.set({ phase: 'done' });
      this.onCompleted();
    } catch (err) {
      this.set({ phase: 'needs-attention', error: messageOf(err) });
    }
  }

  retry(keys?: number[]) {
    const wanted = new Set(keys ?? this.snapshot.items.filter((it) => it.status === 'failed').map((it) => it.key));
    if (this.snapshot.phase !== 'needs-attention' && this.snapshot.phase !== 'running') return;
    this.controller = this.controller.signal.aborted ? new AbortController() : this.controller;
    const items = this.snapshot.items.map((it) => (wanted.has(it.key) && it.status === 'failed' ? { ...it, status: 'queued' as const, message: null } : it));
    this.set({ phase: 'running', error: null, items });
    this.pump();
  }

  /** Stops uploads in flight; what was stored stays, and picking the same files again resumes. */
  stop() {
    this.controller.abort();
    const items = this.snapshot.items.map((it) => (SETTLED.has(it.status) || it.status === 'uploading' ? it : { ...it, status: 'failed' as const, message: 'not sent: the import was stopped' }));
    this.set({ items });
    this.settleIfDone();
  }
}

export function importTotals(items: ImportItem[]) {
  const totalBytes = items.reduce((s, it) => s + it.sizeBytes, 0);
  const doneBytes = items.reduce((s, it) => s + (SETTLED.has(it.status) && it.status !== 'failed' ? it.sizeBytes : it.loadedBytes), 0);
  const count = (status: ItemStatus) => items.filter((it) => it.status === status).length;
  const settled = items.filter((it) => SETTLED.has(it.status) && it.status !== 'failed').length;
  return {
    totalBytes,
    doneBytes,
    settled,
    percent: totalBytes > 0 ? Math.floor((doneBytes / totalBytes) * 100) : items.length ? Math.floor((settled / items.length) * 100) : 0,
    stored: count('stored'),
    duplicate: count('duplicate') + count('skipped'),
    refused: count('refused'),
    failed: count('failed'),
  };
}
