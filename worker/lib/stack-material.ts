// What the contact sheet and the bundle of one stack are made from, read from the database in one
// place: the stack, its session and plan, its frames in order with their files and check marks.
import fs from 'node:fs/promises';
import path from 'node:path';
import { In, type EntityManager } from 'typeorm';
import { getDataSource } from '../../server/lib/data-source';
import { getStore, storageKeys } from '../../server/lib/storage';
import { Frame, ShootSession, Stack, StoredFile } from '../../server/entities/session';
import { Plan } from '../../server/entities/plan';
import { checkCodesByFrame } from '../../server/services/frame-check-codes';
import type { FileRole } from '@shared/schemas/manifest';
import type { ContactSheetInput } from './contact-sheet';
import type { BundleStackInput } from './bundle';
import { planText } from './plan-text';

export interface MaterialFrame {
  frame: Frame;
  /** RAW side first, then the picture, then anything else. */
  files: StoredFile[];
  checkCodes: string[];
}

export interface StackMaterial {
  stack: Stack;
  session: ShootSession;
  plan: Plan | null;
  /** Every frame of the stack in order, excluded ones too. */
  frames: MaterialFrame[];
}

/** null when the stack is gone. */
export async function loadStackMaterial(stackId: string, manager: EntityManager = getDataSource().manager): Promise<StackMaterial | null> {
  const stack = await manager.getRepository(Stack).findOneBy({ id: stackId });
  if (!stack) return null;
  const session = await manager.getRepository(ShootSession).findOneByOrFail({ id: stack.sessionId });
  const plan = stack.planId ? await manager.getRepository(Plan).findOneBy({ id: stack.planId, studioId: session.studioId }) : null;
  const frames = await manager.getRepository(Frame).find({ where: { stackId }, order: { position: 'ASC', captureTimeMs: 'ASC' } });
  const files = frames.length ? await manager.getRepository(StoredFile).find({ where: { frameId: In(frames.map((f) => f.id)) } }) : [];
  const codes = await checkCodesByFrame(stackId, manager);
  return {
    stack,
    session,
    plan,
    frames: frames.map((frame) => {
      const own = files.filter((f) => f.frameId === frame.id);
      const rank = (f: StoredFile) => ROLE_ORDER[fileRole(f, own.length)];
      return { frame, files: own.sort((a, b) => rank(a) - rank(b) || a.originalName.localeCompare(b.originalName)), checkCodes: codes.get(frame.id) ?? [] };
    }),
  };
}

// As the sorting pairs files: a TIFF-container or ISO-BMFF raw file beside a picture of the same
// exposure is the RAW side (a TIFF twin of a JPEG is that case).
const RAW_SIDE_KINDS = new Set(['tiff-raw', 'dng', 'bmff-raw']);

export function fileRole(file: StoredFile, filesInFrame: number): FileRole {
  if (file.isRaw || (filesInFrame > 1 && RAW_SIDE_KINDS.has(file.kind))) return 'raw';
  return file.kind === 'jpeg' ? 'jpeg' : 'other';
}
const ROLE_ORDER: Record<FileRole, number> = { raw: 0, jpeg: 1, other: 2 };

export const includedFrames = (m: StackMaterial) => m.frames.filter((f) => !f.frame.excluded);

/**
 * The capture time as the camera's wall clock with its UTC offset ("2026-05-14T11:30:00.250+02:00"),
 * so sheets and manifests show the time the photographer saw, whatever the server's zone.
 */
export function captureTimeIso(captureTimeMs: number | null, offsetMinutes: number | null): string | null {
  if (captureTimeMs === null) return null;
  const offset = offsetMinutes ?? 0;
  const local = new Date(captureTimeMs + offset * 60_000).toISOString().slice(0, -1);
  if (offsetMinutes === null) return `${local}Z`;
  const sign = offset < 0 ? '-' : '+';
  const abs = Math.abs(offset);
  return `${local}${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

function offsetOf(m: MaterialFrame): number | null {
  const primary = m.files.find((f) => f.id === m.frame.primaryFileId) ?? m.files[0];
  const offset = (primary?.metadata as { offsetMinutes?: unknown } | undefined)?.offsetMinutes;
  return typeof offset === 'number' ? offset : null;
}

export function contactSheetInput(m: StackMaterial): ContactSheetInput {
  const store = getStore();
  const included = includedFrames(m);
  return {
    header: {
      sessionTitle: m.session.title,
      stackName: m.stack.name,
      planName: m.plan?.name ?? null,
      frameCount: m.frames.length,
      excludedCount: m.frames.length - included.length,
      flaggedCount: included.filter((f) => f.checkCodes.length > 0).length,
    },
    frames: included.map((f, index) => ({
      number: index + 1,
      // A frame without a finished preview points at where it would be; the sheet draws a grey cell.
      smallPreviewPath: store.localPath(f.frame.previewStatus === 'done' && f.frame.previewSmallKey ? f.frame.previewSmallKey : storageKeys.preview(m.session.id, f.frame.id, 'small')),
      captureTimeIso: captureTimeIso(f.frame.captureTimeMs, offsetOf(f)),
      exposureTimeS: f.frame.exposureTimeS,
      fNumber: f.frame.fNumber,
      iso: f.frame.iso,
      checkCodes: f.checkCodes,
    })),
  };
}

const extOf = (name: string) => {
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot + 1) : '';
};

export function bundleStackInput(m: StackMaterial, sheet: { jpegPath: string; pdfPath: string } | null): BundleStackInput {
  const store = getStore();
  return {
    name: m.stack.name,
    frames: includedFrames(m).map((f) => ({
      order: f.frame.position,
      files: f.files.map((file) => ({
        path: store.localPath(file.storageKey),
        originalName: file.originalName,
        ext: extOf(file.originalName),
        sha256: file.sha256,
        role: fileRole(file, f.files.length),
      })),
      captureTimeIso: captureTimeIso(f.frame.captureTimeMs, offsetOf(f)),
      exposureTimeS: f.frame.exposureTimeS,
      fNumber: f.frame.fNumber,
      iso: f.frame.iso,
      focalLengthMm: f.frame.focalLengthMm,
      flags: f.checkCodes,
    })),
    contactSheetJpegPath: sheet?.jpegPath ?? null,
    contactSheetPdfPath: sheet?.pdfPath ?? null,
    planText: m.plan ? planText(m.plan, includedFrames(m).length) : null,
  };
}

/**
 * Removes temporary siblings (`<name>.part-…`) a killed worker left beside outPath. Only the job
 * that owns outPath calls this, so no live write is touched.
 */
export async function removeLeftoverParts(outPath: string): Promise<number> {
  const dir = path.dirname(outPath);
  const prefix = `${path.basename(outPath)}.part-`;
  const names = await fs.readdir(dir).catch(() => [] as string[]);
  const leftovers = names.filter((n) => n.startsWith(prefix));
  await Promise.all(leftovers.map((n) => fs.rm(path.join(dir, n), { force: true })));
  return leftovers.length;
}
