// The checks of one stack: loads the stack as it is now (the payload's version only says which
// change asked), runs the checks and stores them unless the stored run already has this input.
// One run per stack at a time (a transaction-scoped advisory lock), so an older input never
// overwrites a newer one.
import type { Job } from 'bullmq';
import { getDataSource } from '../../server/lib/data-source';
import { loadCheckStates } from '../../server/services/check-input';
import { storeCheckRun } from '../../server/services/check-results-service';
import type { Payload } from '../queues';

export async function stackChecksJob(job: Job<Payload<'stackChecks'>>): Promise<{ outcome: string }> {
  const { stackId } = job.data;
  return getDataSource().transaction(async (tx) => {
    await tx.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [`stack-checks:${stackId}`]);
    const [state] = await loadCheckStates(tx, { stackId });
    if (!state) return { outcome: 'stack gone' };
    // The last preview to finish queues the run again.
    if (state.pendingPreviews > 0) return { outcome: `waiting for ${state.pendingPreviews} previews` };
    await job.updateProgress(50);
    const outcome = await storeCheckRun(tx, state);
    await job.updateProgress(100);
    return { outcome: outcome === 'stored' ? `checked version ${state.stack.version}` : 'already current' };
  });
}
