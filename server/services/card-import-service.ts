import { getDataSource } from '../lib/data-source';
import { Conflict, NotFound } from '../lib/errors';
import { getStore, storageKeys } from '../lib/storage';
import { readCaptureMetadata } from '../lib/metadata';
import type { ReceivedCardFile } from '../lib/card-upload';
import { CardImport } from '../entities/session';
import { displayNameOf } from '../../shared/file-names';
import { sessionInStudio } from './session-service';
import { regroupSession } from './sorting-service';

export type FileOutcome =
  | { name: string; status: 'stored'; fileId: string; sha256: string; flags: string[] }
  | { name: string; status: 'duplicate'; fileId: string; sha256: string }
  | { name: string; status: 'refused'; reason: string };

export async function createImport(studioId: string, sessionId: string, userId: string, expectedFiles?: number) {
  await sessionInStudio(studioId, sessionId);
  const repo = getDataSource().getRepository(CardImport);
  const imp = await repo.save(repo.create({ sessionId, createdBy: userId, expectedFiles: expectedFiles ?? null, storedCount: 0, duplicateCount: 0, refusedCount: 0 }));
  return importView(imp);
}

function importView(i: CardImport) {
  return {
    id: i.id,
    sessionId: i.sessionId,
    createdAt: i.createdAt.toISOString(),
    completedAt: i.completedAt?.toISOString() ?? null,
    expectedFiles: i.expectedFiles,
    storedCount: i.storedCount,
    duplicateCount: i.duplicateCount,
    refusedCount: i.refusedCount,
  };
}

async function importInSession(studioId: string, sessionId: string, importId: string): Promise<CardImport> {
  await sessionInStudio(studioId, sessionId);
  const imp = /^[0-9a-f-]{36}$/i.test(importId) ? await getDataSource().getRepository(CardImport).findOneBy({ id: importId, sessionId }) : null;
  if (!imp) throw new NotFound('No such card import in this session.');
  return imp;
}

/** Which of these SHA-256 sums the session already holds, so a resumed import can skip them. */
export async function knownHashes(studioId: string, sessionId: string, sha256: string[]): Promise<string[]> {
  await sessionInStudio(studioId, sessionId);
  if (sha256.length === 0) return [];
  const rows: { sha256: string }[] = await getDataSource().query(
    `SELECT sha256 FROM stored_files WHERE session_id = $1 AND sha256 = ANY($2)`,
    [sessionId, sha256],
  );
  return rows.map((r) => r.sha256);
}

/**
 * Records the files of one upload request: each received file is renamed into place under its
 * SHA-256 and recorded in the same step; a file the session already holds is reported as a
 * duplicate and not stored twice; a refused file is reported with its reason.
 */
export async function recordUploadedFiles(
  studioId: string,
  sessionId: string,
  importId: string,
  files: (Express.Multer.File & ReceivedCardFile)[],
  mtimesMs: (number | null)[],
): Promise<FileOutcome[]> {
  const imp = await importInSession(studioId, sessionId, importId);
  if (imp.completedAt) {
    await Promise.all(files.map((f) => f.discard?.()));
    throw new Conflict('This card import is finished; start a new import to add files.');
  }
  const ds = getDataSource();
  const outcomes: FileOutcome[] = [];
  for (const [index, file] of files.entries()) {
    const name = file.originalname;
    if (file.outcome === 'refused' || !file.put || !file.sniff || !file.commit) {
      outcomes.push({ name, status: 'refused', reason: file.reason ?? 'not accepted' });
      continue;
    }
    const { sha256, sizeBytes } = file.put;
    const existing: { id: string }[] = await ds.query(`SELECT id FROM stored_files WHERE session_id = $1 AND sha256 = $2`, [sessionId, sha256]);
    if (existing.length) {
      await file.discard?.();
      outcomes.push({ name, status: 'duplicate', fileId: existing[0].id, sha256 });
      continue;
    }
    const key = storageKeys.original(sessionId, sha256);
    await file.commit(key);
    const meta = await readCaptureMetadata(getStore().localPath(key), { fileName: name, fileMtimeMs: mtimesMs[index] ?? null });
    const flags = [...meta.flags];
    const inserted: { id: string }[] = await ds.query(
      `INSERT INTO stored_files (session_id, import_id, sha256, original_name, display_name, storage_key, size_bytes, kind, mime, is_raw, file_mtime_ms, metadata, capture_time_ms, flags)
       VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$13,$14)
       ON CONFLICT (session_id, sha256) DO NOTHING RETURNING id`,
      [sessionId, importId, sha256, name, displayNameOf(name), key, sizeBytes, file.sniff.kind, file.sniff.mime, file.sniff.isRaw, mtimesMs[index] ?? null, JSON.stringify(meta), meta.captureTimeMs, flags],
    );
    if (inserted.length) {
      outcomes.push({ name, status: 'stored', fileId: inserted[0].id, sha256, flags });
    } else {
      // The same content arrived in a parallel request a moment earlier: the stored file is identical.
      const [row] = await ds.query(`SELECT id FROM stored_files WHERE session_id = $1 AND sha256 = $2`, [sessionId, sha256]);
      outcomes.push({ name, status: 'duplicate', fileId: row.id, sha256 });
    }
  }
  const count = (s: FileOutcome['status']) => outcomes.filter((o) => o.status === s).length;
  await ds.query(
    `UPDATE card_imports SET stored_count = stored_count + $2, duplicate_count = duplicate_count + $3, refused_count = refused_count + $4 WHERE id = $1`,
    [importId, count('stored'), count('duplicate'), count('refused')],
  );
  return outcomes;
}

/** Ends an import: frames are paired, the session is re-grouped, previews are queued. */
export async function completeImport(studioId: string, sessionId: string, importId: string, userId: string) {
  const imp = await importInSession(studioId, sessionId, importId);
  if (!imp.completedAt) {
    await getDataSource().getRepository(CardImport).update({ id: imp.id }, { completedAt: new Date() });
  }
  await regroupSession(studioId, sessionId, userId, { label: 'card import' });
  return importView((await getDataSource().getRepository(CardImport).findOneByOrFail({ id: imp.id })));
}

export async function listImports(studioId: string, sessionId: string) {
  await sessionInStudio(studioId, sessionId);
  const rows = await getDataSource().getRepository(CardImport).find({ where: { sessionId }, order: { createdAt: 'DESC' } });
  return rows.map(importView);
}
