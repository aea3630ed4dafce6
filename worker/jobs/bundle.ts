// One bundle: the zip of a stack version, or of a session's stacks past draft (a folder each).
// Contact sheets missing for a stack version are made first. Progress goes to the job and to the
// bundle's row (the client polls the API); the zip is written under a temporary name and renamed
// when complete, and a retry after a killed worker first removes what that worker left behind.
import type { Job } from 'bullmq';
import { getDataSource } from '../../server/lib/data-source';
import { getStore } from '../../server/lib/storage';
import { stackFileKeys } from '../../server/lib/stack-file-keys';
import { Bundle } from '../../server/entities/bundle';
import { writeBundle, type BundleStackInput } from '../lib/bundle';
import { bundleStackInput, includedFrames, loadStackMaterial, removeLeftoverParts, type StackMaterial } from '../lib/stack-material';
import { ensureContactSheet } from './stack-sheet';
import type { Payload } from '../queues';

/** Share of the progress bar for making missing contact sheets; the rest is the zip. */
const SHEETS_SHARE = 10;

export async function bundleJob(job: Job<Payload<'bundle'>>): Promise<{ outcome: string; bytes?: number }> {
  const repo = getDataSource().getRepository(Bundle);
  const bundle = await repo.findOneBy({ id: job.data.bundleId });
  if (!bundle) return { outcome: 'bundle gone' };
  const store = getStore();
  const key = stackFileKeys.bundle(bundle.sessionId, bundle.id);
  if (bundle.status === 'done' && (await store.exists(key))) return { outcome: 'already done' };

  await repo.update({ id: bundle.id }, { status: 'running', progress: 0, error: null });
  let lastPercent = 0;
  let writes = Promise.resolve();
  const report = (percent: number) => {
    const p = Math.max(0, Math.min(99, Math.floor(percent)));
    if (p <= lastPercent) return;
    lastPercent = p;
    writes = writes.then(async () => {
      await job.updateProgress(p);
      await repo.update({ id: bundle.id, status: 'running' }, { progress: p });
    }).catch(() => undefined); // progress is advisory: a missed write must not fail the bundle
  };

  const materials: StackMaterial[] = [];
  for (const [stackId, version] of Object.entries(bundle.stackVersions)) {
    const m = await loadStackMaterial(stackId);
    if (!m || m.stack.version !== version) {
      const now = m ? `it is at version ${m.stack.version} now` : 'it was removed';
      await repo.update({ id: bundle.id }, {
        status: 'failed',
        error: `A stack changed after this bundle was requested (version ${version} asked for, ${now}). Make a new bundle.`,
        finishedAt: new Date(),
      });
      return { outcome: 'stack changed' };
    }
    if (includedFrames(m).length > 0) materials.push(m);
  }
  if (materials.length === 0) {
    await repo.update({ id: bundle.id }, { status: 'failed', error: 'Every frame of the bundle’s stacks is excluded: there is nothing to bundle.', finishedAt: new Date() });
    return { outcome: 'nothing to bundle' };
  }
  // Session bundles keep the stacks in the session's order.
  materials.sort((a, b) => a.stack.position - b.stack.position);

  const stacks: BundleStackInput[] = [];
  for (const [index, m] of materials.entries()) {
    stacks.push(bundleStackInput(m, await ensureContactSheet(m)));
    report(((index + 1) / materials.length) * SHEETS_SHARE);
  }

  const outPath = await store.localPathForWrite(key);
  await removeLeftoverParts(outPath);
  const { bytes } = await writeBundle({
    outPath,
    folder: bundle.kind === 'session',
    stacks,
    onProgress: (fraction) => report(SHEETS_SHARE + fraction * (100 - SHEETS_SHARE)),
  });
  await writes;
  await repo.update({ id: bundle.id }, { status: 'done', progress: 100, storageKey: key, bytes, error: null, finishedAt: new Date() });
  await job.updateProgress(100);
  return { outcome: 'done', bytes };
}

/** After the last retry: leave a readable error on the bundle. */
export async function bundleFailed(data: Payload<'bundle'>, err: Error) {
  await getDataSource()
    .getRepository(Bundle)
    .update({ id: data.bundleId }, { status: 'failed', error: `The bundle could not be made: ${err.message}`, finishedAt: new Date() });
}
