// The bundle and contact sheet as a retoucher meets them: whether the bundle of the stack's
// current version is ready, asking for one when it is not, and opening it for download.
import type { Readable } from 'node:stream';
import { getDataSource } from '../lib/data-source';
import { Conflict } from '../lib/errors';
import { logger } from '../lib/logger';
import { Bundle } from '../entities/bundle';
import { Stack } from '../entities/session';
import type { BundleAvailability } from '../../shared/schemas/handoff';
import { openBundleForDownload, requestStackBundle } from './bundle-service';
import { contactSheetView } from './contact-sheet-service';

export interface BundleState {
  status: BundleAvailability;
  bundleId: string | null;
  sizeBytes: number | null;
}

/** The newest bundle of the stack's current version, as ready, being prepared, or none. */
export async function bundleStateOf(stack: Stack): Promise<BundleState> {
  const bundle = await getDataSource().getRepository(Bundle).findOne({
    where: { stackId: stack.id, stackVersion: stack.version, kind: 'stack' },
    order: { createdAt: 'DESC' },
  });
  if (!bundle || bundle.status === 'failed') return { status: 'none', bundleId: null, sizeBytes: null };
  if (bundle.status === 'done') return { status: 'ready', bundleId: bundle.id, sizeBytes: bundle.bytes };
  return { status: 'preparing', bundleId: bundle.id, sizeBytes: null };
}

export async function contactSheetReady(stack: Stack): Promise<boolean> {
  return (await contactSheetView(stack)).status === 'done';
}

/** Asks for the bundle as the stack is handed off, so it is ready when the retoucher comes. */
export async function prepareBundleForHandoff(stackId: string, actorUserId: string | null): Promise<void> {
  try {
    await requestStackBundle(stackId, actorUserId);
  } catch (err) {
    logger.warn({ err, stackId }, 'could not ask for the bundle at hand-off; it will be made on first download');
  }
}

/** Asks for the bundle of the stack's current version unless one is ready or being made. */
export async function askForBundle(stack: Stack, actorUserId: string | null): Promise<BundleState> {
  const state = await bundleStateOf(stack);
  if (state.status !== 'none') return state;
  await requestStackBundle(stack.id, actorUserId);
  return bundleStateOf(stack);
}

export interface OpenedBundle {
  stream: Readable;
  sizeBytes: number;
  fileName: string;
}

const PREPARING = 'The bundle is being prepared, try again in a minute.';

/** The ready bundle, or a 409 after asking for one when none is ready. */
export async function openStackBundle(stack: Stack, actorUserId: string | null): Promise<OpenedBundle> {
  const state = await bundleStateOf(stack);
  if (state.status === 'ready' && state.bundleId) return openBundleForDownload(state.bundleId);
  if (state.status === 'none') await requestStackBundle(stack.id, actorUserId);
  throw new Conflict(PREPARING, { bundle: 'preparing' });
}
