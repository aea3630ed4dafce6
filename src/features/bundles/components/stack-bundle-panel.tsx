import { useEffect, useRef } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { StackDetailView } from '@shared/schemas/bundles';
import { Button } from '@/components/button';
import { ErrorNote } from '@/components/query-state';
import { count } from '@/lib/units';
import { isWorking, useBundle } from '../api/get-bundle';
import { useRequestStackBundle } from '../api/request-stack-bundle';
import { bytes } from '../lib/format';
import { BundleStatus } from './bundle-status';

interface Props {
  studioId: string;
  stack: StackDetailView;
  canEdit: boolean;
  canDownload: boolean;
}

/** The stack's latest bundle: make one, follow its progress, download it, see when it is stale. */
export function StackBundlePanel({ studioId, stack, canEdit, canDownload }: Props) {
  const qc = useQueryClient();
  const request = useRequestStackBundle(studioId, stack.id);
  const latest = useBundle(studioId, stack.latestBundle?.id ?? null, stack.latestBundle);
  const bundle = latest.data ?? stack.latestBundle;
  const working = isWorking(bundle);

  // When a bundle being followed finishes, the stack page reads the stack again (its sheet is made).
  const wasWorking = useRef(working);
  useEffect(() => {
    if (wasWorking.current && !working) qc.invalidateQueries({ queryKey: ['studios', studioId, 'stacks', stack.id] });
    wasWorking.current = working;
  }, [working, qc, studioId, stack.id]);

  const current = !!bundle && !bundle.stale && bundle.status !== 'failed';
  return (
    <section aria-labelledby="bundle-h" className="rounded border border-rule bg-card p-4">
      <h2 id="bundle-h" className="text-lg font-semibold">Bundle</h2>
      <p className="text-sm text-slate">
        One zip for the merging software: the {count(stack.counts.included)} kept frames’ original files renamed in stack order
        ({bytes(stack.counts.bytes)}; a RAW and its JPEG share a number), the manifest, the contact sheet and the linked plan.
      </p>
      <div className="mt-3 space-y-3" aria-live="polite">
        {bundle ? (
          <>
            {bundle.stale ? (
              <p className="rounded border border-amber/50 bg-amber/10 px-3 py-2 text-sm">
                The stack changed since this bundle was asked for (it holds version {bundle.stackVersion}; the stack is at version {stack.version}).
                {canEdit ? ' Make a new bundle to include the changes.' : ' Ask a photographer for a new bundle.'}
              </p>
            ) : null}
            <BundleStatus studioId={studioId} bundle={bundle} canDownload={canDownload} what={stack.name} />
          </>
        ) : (
          <p className="text-sm text-slate">No bundle yet.</p>
        )}
        {canEdit && !current ? (
          <Button disabled={request.isPending || stack.counts.included === 0} onClick={() => request.mutate()}>
            {bundle?.status === 'failed' ? 'Try the bundle again' : 'Make bundle'}
          </Button>
        ) : null}
        {canEdit && stack.counts.included === 0 ? <p className="text-sm text-clay">Every frame is excluded: there is nothing to bundle.</p> : null}
        {request.error ? <ErrorNote error={request.error} /> : null}
        {latest.error ? <ErrorNote error={latest.error} /> : null}
      </div>
    </section>
  );
}
