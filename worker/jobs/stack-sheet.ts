// The contact sheet (JPEG + PDF) of one stack version. Waits politely while the stack's previews
// are still being made (the job puts itself back with a delay), then draws grey cells for any
// preview that is still missing rather than failing the sheet.
import { DelayedError, type Job } from 'bullmq';
import { getDataSource } from '../../server/lib/data-source';
import { getStore } from '../../server/lib/storage';
import { stackFileKeys } from '../../server/lib/stack-file-keys';
import { ContactSheet } from '../../server/entities/bundle';
import { renderContactSheetJpeg, renderContactSheetPdf } from '../lib/contact-sheet';
import { contactSheetInput, includedFrames, loadStackMaterial, removeLeftoverParts, type StackMaterial } from '../lib/stack-material';
import type { Payload } from '../queues';

/** How long a sheet waits for pending previews before drawing grey cells for them. */
export const PREVIEW_WAIT_MS = 2 * 60_000;
export const RECHECK_MS = 2000;

export interface SheetFiles {
  jpegPath: string;
  pdfPath: string;
}

const sheetLock = (stackId: string, version: number) => `contact-sheet:${stackId}:${version}`;

/**
 * Makes the sheet of the material's stack version unless it is already made. One maker at a time
 * per stack version (a transaction-scoped advisory lock), so a sheet job and a bundle job that
 * both need it never write over each other.
 */
export async function ensureContactSheet(m: StackMaterial): Promise<SheetFiles> {
  const { stack, session } = m;
  const store = getStore();
  const jpegKey = stackFileKeys.contactSheet(session.id, stack.id, stack.version, 'jpg');
  const pdfKey = stackFileKeys.contactSheet(session.id, stack.id, stack.version, 'pdf');
  const files = { jpegPath: store.localPath(jpegKey), pdfPath: store.localPath(pdfKey) };
  const repo = getDataSource().getRepository(ContactSheet);
  await getDataSource().transaction(async (tx) => {
    await tx.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [sheetLock(stack.id, stack.version)]);
    const row = await repo.findOneBy({ stackId: stack.id, stackVersion: stack.version });
    if (row?.status === 'done' && (await store.exists(jpegKey)) && (await store.exists(pdfKey))) return;
    await repo.upsert({ stackId: stack.id, stackVersion: stack.version, status: 'running', error: null, missingPreviews: 0, finishedAt: null }, ['stackId', 'stackVersion']);
    const jpegPath = await store.localPathForWrite(jpegKey);
    const pdfPath = await store.localPathForWrite(pdfKey);
    await removeLeftoverParts(jpegPath);
    await removeLeftoverParts(pdfPath);
    const input = contactSheetInput(m);
    const jpeg = await renderContactSheetJpeg(input, jpegPath);
    const pdf = await renderContactSheetPdf(input, pdfPath);
    await repo.update(
      { stackId: stack.id, stackVersion: stack.version },
      { status: 'done', jpegKey, pdfKey, pages: pdf.pages, widthPx: jpeg.widthPx, heightPx: jpeg.heightPx, missingPreviews: jpeg.missingPreviewNumbers.length, finishedAt: new Date() },
    );
  });
  return files;
}

/**
 * While any frame's preview is still being made (a hand-off right after the import), put the job
 * back for a moment instead of drawing grey cells; after PREVIEW_WAIT_MS draw what there is.
 */
async function waitForPreviews(job: Job, token: string | undefined, materials: StackMaterial[], waitMs = PREVIEW_WAIT_MS) {
  const pending = materials.some((m) => includedFrames(m).some((f) => f.frame.previewStatus === 'pending'));
  if (pending && token && Date.now() - job.timestamp < waitMs) {
    await job.updateProgress(5);
    await job.moveToDelayed(Date.now() + RECHECK_MS, token);
    throw new DelayedError();
  }
}

export async function stackSheetJob(job: Job<Payload<'stackSheet'>>, token?: string): Promise<{ outcome: string }> {
  const { stackId, version } = job.data;
  const repo = getDataSource().getRepository(ContactSheet);
  const m = await loadStackMaterial(stackId);
  if (!m) return { outcome: 'stack gone' };
  if (m.stack.version !== version) {
    // The stack changed since the request: a sheet of the old arrangement is of no use, and the
    // frames it would show are no longer the ones of that version.
    await repo.delete({ stackId, stackVersion: version, status: 'queued' });
    return { outcome: `superseded by version ${m.stack.version}` };
  }
  await waitForPreviews(job, token, [m]);
  await job.updateProgress(10);
  await ensureContactSheet(m);
  await job.updateProgress(100);
  return { outcome: 'done' };
}

/** After the last retry: leave a readable error on the sheet's row. */
export async function stackSheetFailed(data: Payload<'stackSheet'>, err: Error) {
  await getDataSource()
    .getRepository(ContactSheet)
    .update({ stackId: data.stackId, stackVersion: data.version }, { status: 'failed', error: `The contact sheet could not be made: ${err.message}`, finishedAt: new Date() });
}
