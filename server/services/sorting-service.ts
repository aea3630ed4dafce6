// Frames from files (RAW+picture pairs), automatic grouping into stacks, and the undo history.
// Stacks a person has marked ready (or moved further) are never touched by automatic grouping.
import type { EntityManager } from 'typeorm';
import type { QueryDeepPartialEntity } from 'typeorm/query-builder/QueryPartialEntity.js';
import { getDataSource } from '../lib/data-source';
import { enqueueMany } from '../lib/queues';
import { Frame, ShootSession, SortingSnapshot, Stack, StoredFile } from '../entities/session';
import { groupIntoStacks } from '../../shared/grouping';
import { pairRawAndJpeg, type CardFile } from '../../shared/raw-pairing';
import { groupingOptionsSchema, type GroupingOptionsInput } from '../../shared/schemas/sessions';
import { NotFound } from '../lib/errors';
import { sessionInStudio } from './session-service';
import { queueChecksAfterChange } from './check-results-service';

type Meta = { exposureTimeS?: number | null; fNumber?: number | null; iso?: number | null; focalLengthMm?: number | null; orientation?: number | null; bodySerial?: string | null; fileNumber?: number | null };

/** Serialises sorting changes per session (parallel uploads finishing, two people editing). */
export async function lockSession(tx: EntityManager, sessionId: string) {
  await tx.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [`sorting:${sessionId}`]);
}

// For pairing, any TIFF-container or ISO-BMFF raw file counts as the RAW side: a camera writes its
// RAW and a JPEG of the same exposure under one base name, and a TIFF twin of a JPEG is that case.
const RAW_SIDE_KINDS = new Set(['tiff-raw', 'dng', 'bmff-raw']);

function toCardFile(f: StoredFile): CardFile {
  const m = f.metadata as Meta;
  return {
    id: f.id,
    fileName: f.displayName,
    isRaw: f.isRaw || RAW_SIDE_KINDS.has(f.kind),
    captureTimeMs: f.captureTimeMs,
    bodySerial: m.bodySerial ?? null,
    fNumber: m.fNumber ?? null,
    focalLengthMm: m.focalLengthMm ?? null,
    exposureTimeS: m.exposureTimeS ?? null,
    iso: m.iso ?? null,
    orientation: m.orientation ?? null,
  };
}

/** Pairs the session's files into frames, keeping each frame's place, exclusion and previews. */
async function rebuildFrames(tx: EntityManager, sessionId: string): Promise<string[]> {
  const files = await tx.getRepository(StoredFile).find({ where: { sessionId }, order: { captureTimeMs: 'ASC', displayName: 'ASC' } });
  const fileById = new Map(files.map((f) => [f.id, f]));
  const frames = await tx.getRepository(Frame).find({ where: { sessionId } });
  const frameById = new Map(frames.map((f) => [f.id, f]));
  const paired = pairRawAndJpeg(files.map(toCardFile));
  const keep = new Set<string>();
  const needPreview: string[] = [];
  for (const p of paired) {
    const members = p.fileIds.map((id) => fileById.get(id)!);
    const picture = members.find((f) => !f.isRaw) ?? null;
    const primary = fileById.get(p.primaryFileId)!;
    const previous = frameById.get(p.id) ?? members.map((f) => (f.frameId ? frameById.get(f.frameId) : undefined)).find(Boolean);
    const flags = [...new Set(members.flatMap((f) => f.flags))];
    const row: QueryDeepPartialEntity<Frame> = {
      id: p.id,
      sessionId,
      primaryFileId: primary.id,
      pictureFileId: picture?.id ?? null,
      fileName: primary.displayName,
      captureTimeMs: p.captureTimeMs,
      bodySerial: p.bodySerial ?? null,
      fNumber: p.fNumber ?? null,
      focalLengthMm: p.focalLengthMm ?? null,
      exposureTimeS: p.exposureTimeS ?? null,
      iso: p.iso ?? null,
      orientation: p.orientation ?? null,
      fileNumber: (primary.metadata as Meta).fileNumber ?? null,
      flags,
    };
    const samePreviewSource = previous && previous.pictureFileId === row.pictureFileId && previous.primaryFileId === row.primaryFileId;
    if (previous && previous.id === p.id) {
      await tx.getRepository(Frame).update({ id: p.id }, row);
      if (!samePreviewSource) needPreview.push(p.id);
    } else {
      await tx.getRepository(Frame).insert({
        ...row,
        stackId: previous?.stackId ?? null,
        position: previous?.position ?? 0,
        excluded: previous?.excluded ?? false,
        previewStatus: 'pending',
      });
      needPreview.push(p.id);
    }
    keep.add(p.id);
    await tx.getRepository(StoredFile).update(p.fileIds, { frameId: p.id });
  }
  const gone = frames.filter((f) => !keep.has(f.id)).map((f) => f.id);
  if (gone.length) await tx.getRepository(Frame).delete(gone);
  return needPreview;
}

export interface SnapshotData {
  stacks: { id: string; name: string; state: string; position: number; startReason: string; planId: string | null; version: number }[];
  frames: { id: string; stackId: string | null; position: number; excluded: boolean }[];
}

export async function takeSnapshot(tx: EntityManager, sessionId: string, label: string, userId: string | null) {
  const stacks = await tx.getRepository(Stack).find({ where: { sessionId } });
  const frames = await tx.getRepository(Frame).find({ where: { sessionId }, select: { id: true, stackId: true, position: true, excluded: true } });
  const snapshot: SnapshotData = {
    stacks: stacks.map((s) => ({ id: s.id, name: s.name, state: s.state, position: s.position, startReason: s.startReason, planId: s.planId, version: s.version })),
    frames: frames.map((f) => ({ id: f.id, stackId: f.stackId, position: f.position, excluded: f.excluded })),
  };
  await tx.getRepository(SortingSnapshot).insert({ sessionId, label, snapshot, createdBy: userId });
  // Keep the last 50 steps of history per session.
  await tx.query(
    `DELETE FROM sorting_snapshots WHERE session_id = $1 AND id NOT IN (SELECT id FROM sorting_snapshots WHERE session_id = $1 ORDER BY created_at DESC LIMIT 50)`,
    [sessionId],
  );
}

/** Restores the arrangement before the last change. Stacks moved past ready since then are kept. */
export async function undoLast(studioId: string, sessionId: string): Promise<{ undone: string }> {
  await sessionInStudio(studioId, sessionId);
  const undone = await getDataSource().transaction(async (tx) => {
    await lockSession(tx, sessionId);
    const last = await tx.getRepository(SortingSnapshot).findOne({ where: { sessionId }, order: { createdAt: 'DESC' } });
    if (!last) throw new NotFound('Nothing to undo.');
    const snap = last.snapshot as SnapshotData;
    const current = await tx.getRepository(Stack).find({ where: { sessionId } });
    const locked = new Set(current.filter((s) => s.state !== 'draft' && s.state !== 'ready').map((s) => s.id));
    const snapIds = new Set(snap.stacks.map((s) => s.id));
    const toDelete = current.filter((s) => !snapIds.has(s.id) && !locked.has(s.id)).map((s) => s.id);
    await tx.getRepository(Frame).createQueryBuilder().update().set({ stackId: null }).where('session_id = :sessionId', { sessionId }).andWhere(locked.size ? 'stack_id NOT IN (:...locked) OR stack_id IS NULL' : 'true', { locked: [...locked] }).execute();
    if (toDelete.length) await tx.getRepository(Stack).delete(toDelete);
    for (const s of snap.stacks) {
      if (locked.has(s.id)) continue;
      await tx.query(
        `INSERT INTO stacks (id, session_id, name, state, position, start_reason, plan_id, version) VALUES ($1,$2,$3,$4,$5,$6,$7,$8)
         ON CONFLICT (id) DO UPDATE SET name = EXCLUDED.name, state = EXCLUDED.state, position = EXCLUDED.position, plan_id = EXCLUDED.plan_id, version = stacks.version + 1, updated_at = now()`,
        [s.id, sessionId, s.name, s.state, s.position, s.startReason, s.planId, s.version],
      );
    }
    const lockedFrames = new Set((await tx.getRepository(Frame).find({ where: { sessionId }, select: { id: true, stackId: true } })).filter((f) => f.stackId && locked.has(f.stackId)).map((f) => f.id));
    for (const f of snap.frames) {
      if (lockedFrames.has(f.id) || (f.stackId && locked.has(f.stackId))) continue;
      await tx.getRepository(Frame).update({ id: f.id, sessionId }, { stackId: f.stackId, position: f.position, excluded: f.excluded });
    }
    await tx.getRepository(SortingSnapshot).delete({ id: last.id });
    return { undone: last.label };
  });
  await queueChecksAfterChange(sessionId);
  return undone;
}

const pad = (n: number) => String(n).padStart(2, '0');

/**
 * Re-pairs files into frames and re-groups every frame that is not in a stack a person marked ready
 * (or moved past ready). Draft stacks are replaced; the arrangement before is kept for undo.
 */
export async function regroupSession(studioId: string, sessionId: string, userId: string | null, opts: { label: string; options?: GroupingOptionsInput }) {
  const session = await sessionInStudio(studioId, sessionId);
  const needPreview = await getDataSource().transaction(async (tx) => {
    await lockSession(tx, sessionId);
    await takeSnapshot(tx, sessionId, opts.label, userId);
    if (opts.options) {
      const merged = groupingOptionsSchema.parse({ ...session.groupingOptions, ...opts.options });
      await tx.getRepository(ShootSession).update({ id: sessionId }, { groupingOptions: merged });
      session.groupingOptions = merged as Record<string, number>;
    }
    const needPreview = await rebuildFrames(tx, sessionId);
    const stacks = await tx.getRepository(Stack).find({ where: { sessionId } });
    const kept = stacks.filter((s) => s.state !== 'draft');
    const keptIds = new Set(kept.map((s) => s.id));
    const frames = await tx.getRepository(Frame).find({ where: { sessionId } });
    const free = frames.filter((f) => !f.stackId || !keptIds.has(f.stackId));
    const drafts = stacks.filter((s) => s.state === 'draft').map((s) => s.id);
    if (drafts.length) {
      await tx.getRepository(Frame).update(free.map((f) => f.id), { stackId: null, position: 0 });
      await tx.getRepository(Stack).delete(drafts);
    }
    const result = groupIntoStacks(
      free.map((f) => ({ id: f.id, fileName: f.fileName, captureTimeMs: f.captureTimeMs, bodySerial: f.bodySerial, fNumber: f.fNumber, focalLengthMm: f.focalLengthMm, exposureTimeS: f.exposureTimeS, iso: f.iso, orientation: f.orientation })),
      session.groupingOptions,
    );
    const frameById = new Map(frames.map((f) => [f.id, f]));
    const startOf = (ids: string[]) => Math.min(...ids.map((id) => frameById.get(id)?.captureTimeMs ?? Number.MAX_SAFE_INTEGER));
    const keptFrames = (id: string) => frames.filter((f) => f.stackId === id).map((f) => f.id);
    const ordered = [
      ...kept.map((s) => ({ kind: 'kept' as const, stack: s, start: startOf(keptFrames(s.id)) })),
      ...result.stacks.map((s) => ({ kind: 'new' as const, group: s, start: startOf(s.frameIds) })),
    ].sort((a, b) => a.start - b.start);
    const usedNames = new Set(kept.map((s) => s.name));
    let n = 0;
    for (const [position, item] of ordered.entries()) {
      if (item.kind === 'kept') {
        await tx.getRepository(Stack).update({ id: item.stack.id }, { position });
        continue;
      }
      let name: string;
      do name = `Stack ${pad(++n)}`;
      while (usedNames.has(name));
      const stack = await tx.getRepository(Stack).save(tx.getRepository(Stack).create({ sessionId, name, state: 'draft', position, startReason: item.group.startReason, version: 1, planId: null }));
      for (const [i, frameId] of item.group.frameIds.entries()) {
        await tx.getRepository(Frame).update({ id: frameId }, { stackId: stack.id, position: i });
      }
    }
    const flagsByFrame = new Map<string, string[]>();
    for (const f of result.flags) flagsByFrame.set(f.frameId, [...(flagsByFrame.get(f.frameId) ?? []), f.code]);
    for (const [frameId, codes] of flagsByFrame) {
      const f = frameById.get(frameId);
      if (f) await tx.getRepository(Frame).update({ id: frameId }, { flags: [...new Set([...f.flags, ...codes])] });
    }
    return needPreview;
  });
  await enqueueMany('framePreview', needPreview.map((frameId) => ({ payload: { frameId, sessionId }, jobId: `preview:${frameId}` })));
  await queueChecksAfterChange(sessionId);
  return { previewsQueued: needPreview.length };
}
