// Contact sheets per stack version: their state for the stack page, asking the worker for one,
// and the stored files once made.
import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { queueFor, enqueue } from '../lib/queues';
import { getStore } from '../lib/storage';
import { ContactSheet } from '../entities/bundle';
import type { Stack } from '../entities/session';
import type { ContactSheetView } from '../../shared/schemas/bundles';

const sheetJobId = (stackId: string, version: number) => `sheet_${stackId}_v${version}`;

function view(stack: Stack, row: ContactSheet | null): ContactSheetView {
  return {
    status: row?.status ?? 'none',
    stackVersion: stack.version,
    error: row?.error ?? null,
    missingPreviews: row?.missingPreviews ?? 0,
    pages: row?.pages ?? null,
    widthPx: row?.widthPx ?? null,
    heightPx: row?.heightPx ?? null,
  };
}

export async function contactSheetView(stack: Stack): Promise<ContactSheetView> {
  return view(stack, await getDataSource().getRepository(ContactSheet).findOneBy({ stackId: stack.id, stackVersion: stack.version }));
}

/**
 * Queues the sheet of the stack's current version. Idempotent: a sheet queued, being made or made
 * is left alone; a failed one, or one made while previews were missing, is made again.
 */
export async function requestContactSheet(stack: Stack): Promise<ContactSheetView> {
  const repo = getDataSource().getRepository(ContactSheet);
  const row = await repo.findOneBy({ stackId: stack.id, stackVersion: stack.version });
  const redo = !row || row.status === 'failed' || (row.status === 'done' && row.missingPreviews > 0);
  if (!redo) return view(stack, row);
  await repo.upsert({ stackId: stack.id, stackVersion: stack.version, status: 'queued', error: null, finishedAt: null, missingPreviews: row?.missingPreviews ?? 0 }, ['stackId', 'stackVersion']);
  // BullMQ keeps finished jobs for a while and ignores a new job with the same id: clear it first.
  const jobId = sheetJobId(stack.id, stack.version);
  const old = await queueFor('stackSheet').getJob(jobId);
  if (old && ((await old.isCompleted()) || (await old.isFailed()))) await old.remove();
  await enqueue('stackSheet', { stackId: stack.id, version: stack.version }, jobId);
  return contactSheetView(stack);
}

/** The stored sheet of the stack's current version; 404 while it is not made. */
export async function contactSheetKey(stack: Stack, ext: 'jpg' | 'pdf'): Promise<string> {
  const row = await getDataSource().getRepository(ContactSheet).findOneBy({ stackId: stack.id, stackVersion: stack.version });
  const key = ext === 'jpg' ? row?.jpegKey : row?.pdfKey;
  if (!row || row.status !== 'done' || !key || !(await getStore().exists(key))) {
    throw new NotFound(`The contact sheet of version ${stack.version} of this stack is not ready${row?.status === 'failed' ? ': it failed, ask for it again' : ' yet'}.`);
  }
  return key;
}
