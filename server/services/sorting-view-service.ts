// What the sorting page shows: stacks in order with their frames, loose frames apart, and files.
import { getDataSource } from '../lib/data-source';
import { Frame, SortingSnapshot, Stack, StoredFile } from '../entities/session';
import { DEFAULT_GROUPING_OPTIONS } from '../../shared/grouping';
import { sessionInStudio } from './session-service';
import { NotFound } from '../lib/errors';
import { captureOffsetMinutes } from './capture-offset';
import { storedCheckCodesForSession } from './check-results-service';
import type { FrameView } from '../../shared/schemas/session-views';


function frameView(f: Frame, files: StoredFile[], checkCodes: string[]): FrameView {
  return {
    id: f.id,
    fileName: f.fileName,
    captureTimeMs: f.captureTimeMs,
    captureOffsetMinutes: captureOffsetMinutes(files, f.primaryFileId),
    fNumber: f.fNumber,
    focalLengthMm: f.focalLengthMm,
    exposureTimeS: f.exposureTimeS,
    iso: f.iso,
    orientation: f.orientation,
    bodySerial: f.bodySerial,
    fileNumber: f.fileNumber,
    excluded: f.excluded,
    flags: f.flags,
    checkCodes,
    previewStatus: f.previewStatus,
    previewError: f.previewError,
    files: files.map((x) => ({ id: x.id, name: x.displayName, kind: x.kind, isRaw: x.isRaw, sizeBytes: x.sizeBytes })),
  };
}

export async function sortingView(studioId: string, sessionId: string) {
  const session = await sessionInStudio(studioId, sessionId);
  const ds = getDataSource();
  const [stacks, frames, files, last, codes] = await Promise.all([
    ds.getRepository(Stack).find({ where: { sessionId }, order: { position: 'ASC' } }),
    ds.getRepository(Frame).find({ where: { sessionId }, order: { captureTimeMs: 'ASC', fileName: 'ASC' } }),
    ds.getRepository(StoredFile).find({ where: { sessionId } }),
    ds.getRepository(SortingSnapshot).findOne({ where: { sessionId }, order: { createdAt: 'DESC' }, select: { id: true, label: true } }),
    storedCheckCodesForSession(sessionId),
  ]);
  const filesByFrame = new Map<string, StoredFile[]>();
  for (const f of files) if (f.frameId) filesByFrame.set(f.frameId, [...(filesByFrame.get(f.frameId) ?? []), f]);
  const view = (f: Frame) => frameView(f, filesByFrame.get(f.id) ?? [], codes.get(f.id) ?? []);
  return {
    sessionId,
    groupingOptions: { ...DEFAULT_GROUPING_OPTIONS, ...session.groupingOptions },
    undoLabel: last?.label ?? null,
    stacks: stacks.map((s) => ({
      id: s.id,
      name: s.name,
      state: s.state,
      position: s.position,
      startReason: s.startReason,
      planId: s.planId,
      version: s.version,
      frames: frames.filter((f) => f.stackId === s.id).sort((a, b) => a.position - b.position).map(view),
    })),
    loose: frames.filter((f) => !f.stackId).map(view),
    fileCount: files.length,
  };
}

export async function listSessionFiles(studioId: string, sessionId: string) {
  await sessionInStudio(studioId, sessionId);
  const files = await getDataSource().getRepository(StoredFile).find({ where: { sessionId }, order: { captureTimeMs: 'ASC', displayName: 'ASC' } });
  return files.map((f) => ({
    id: f.id,
    name: f.displayName,
    originalName: f.originalName,
    kind: f.kind,
    isRaw: f.isRaw,
    sizeBytes: f.sizeBytes,
    sha256: f.sha256,
    captureTimeMs: f.captureTimeMs,
    frameId: f.frameId,
    flags: f.flags,
    metadata: f.metadata,
  }));
}

/** The storage key of a frame's preview, once the worker has made it. */
export async function previewKey(studioId: string, sessionId: string, frameId: string, size: string): Promise<string> {
  await sessionInStudio(studioId, sessionId);
  if (size !== 'small' && size !== 'large') throw new NotFound('Previews come in "small" and "large".');
  const frame = /^[0-9a-f-]{36}$/i.test(frameId) ? await getDataSource().getRepository(Frame).findOneBy({ id: frameId, sessionId }) : null;
  if (!frame) throw new NotFound('No such frame in this session.');
  const key = size === 'small' ? frame.previewSmallKey : frame.previewLargeKey;
  if (!key || frame.previewStatus !== 'done') throw new NotFound('This preview is not ready yet.');
  return key;
}
