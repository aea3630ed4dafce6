// The stack page: one stack with its frames in order, settings and marks, the contact sheet of
// its current version, its latest bundle (stale or not) and to whom it was handed.
import { In } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { Frame, StoredFile } from '../entities/session';
import { Plan } from '../entities/plan';
import { User } from '../entities/user';
import type { StackDetailView } from '../../shared/schemas/bundles';
import type { StackInStudio } from './stack-access';
import { checkCodesByFrame } from './frame-check-codes';
import { contactSheetView } from './contact-sheet-service';
import { latestStackBundle } from './bundle-service';
import { captureOffsetMinutes } from './capture-offset';

export async function stackDetail({ stack, session }: StackInStudio): Promise<StackDetailView> {
  const ds = getDataSource();
  const frames = await ds.getRepository(Frame).find({ where: { stackId: stack.id }, order: { position: 'ASC', captureTimeMs: 'ASC' } });
  const files = frames.length ? await ds.getRepository(StoredFile).find({ where: { frameId: In(frames.map((f) => f.id)) }, order: { isRaw: 'DESC', displayName: 'ASC' } }) : [];
  const [codes, plan, handedUser, contactSheet, latestBundle] = await Promise.all([
    checkCodesByFrame(stack.id),
    stack.planId ? ds.getRepository(Plan).findOne({ where: { id: stack.planId, studioId: session.studioId }, select: { id: true, name: true } }) : null,
    stack.handedToUserId ? ds.getRepository(User).findOne({ where: { id: stack.handedToUserId }, select: { id: true, name: true, email: true } }) : null,
    contactSheetView(stack),
    latestStackBundle(stack.id),
  ]);
  let bundleNumber = 0;
  const frameViews = frames.map((f, index) => {
    const own = files.filter((x) => x.frameId === f.id);
    return {
      id: f.id,
      number: index + 1,
      bundleNumber: f.excluded ? null : ++bundleNumber,
      fileName: f.fileName,
      captureTimeMs: f.captureTimeMs,
      captureOffsetMinutes: captureOffsetMinutes(own, f.primaryFileId),
      exposureTimeS: f.exposureTimeS,
      fNumber: f.fNumber,
      iso: f.iso,
      focalLengthMm: f.focalLengthMm,
      excluded: f.excluded,
      flags: f.flags,
      checkCodes: codes.get(f.id) ?? [],
      previewStatus: f.previewStatus,
      previewError: f.previewError,
      files: own.map((x) => ({ name: x.displayName, kind: x.kind, isRaw: x.isRaw, sizeBytes: x.sizeBytes })),
    };
  });
  const included = frameViews.filter((f) => !f.excluded);
  return {
    id: stack.id,
    name: stack.name,
    state: stack.state,
    version: stack.version,
    session: { id: session.id, title: session.title, shootDate: session.shootDate },
    plan: plan ? { id: plan.id, name: plan.name } : null,
    counts: {
      frames: frameViews.length,
      included: included.length,
      excluded: frameViews.length - included.length,
      flagged: included.filter((f) => f.checkCodes.length > 0).length,
      previewsPending: frameViews.filter((f) => f.previewStatus === 'pending').length,
      bytes: included.reduce((sum, f) => sum + f.files.reduce((s, x) => s + x.sizeBytes, 0), 0),
    },
    frames: frameViews,
    contactSheet,
    latestBundle,
    handedTo: stack.handedToUserId || stack.handedToEmail
      ? { userId: stack.handedToUserId, name: handedUser?.name ?? null, email: handedUser?.email ?? stack.handedToEmail, at: stack.handedOffAt?.toISOString() ?? null }
      : null,
  };
}

/** The small or large preview of a frame of this stack, once made. */
export async function stackFramePreviewKey({ stack }: StackInStudio, frameId: string, size: string): Promise<string> {
  if (size !== 'small' && size !== 'large') throw new NotFound('Previews come in "small" and "large".');
  const frame = /^[0-9a-f-]{36}$/i.test(frameId) ? await getDataSource().getRepository(Frame).findOneBy({ id: frameId, stackId: stack.id }) : null;
  if (!frame) throw new NotFound('No such frame in this stack.');
  const key = size === 'small' ? frame.previewSmallKey : frame.previewLargeKey;
  if (!key || frame.previewStatus !== 'done') throw new NotFound('This preview is not ready yet.');
  return key;
}
