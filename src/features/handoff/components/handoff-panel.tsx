import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { HandoffView, MergedResultView, NewShareLink } from '@shared/schemas/handoff';
import { STACK_STATE_LABELS } from '@shared/handoff-rules';
import { Button } from '@/components/button';
import { ErrorNote, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { handoffQueryOptions, mergedFileUrl, mergedPreviewUrl, useHandoff } from '../api/get-handoff';
import { useTakeBackStack } from '../api/take-back-stack';
import { useArchiveStack } from '../api/archive-stack';
import { memberMergedUrl } from '../api/upload-merged';
import { when } from '../lib/format';
import { HandOffForm } from './hand-off-form';
import { NewLinkNotice } from './new-link-notice';
import { ShareLinkList } from './share-link-list';
import { MergedResultCard } from './merged-result-card';
import { MergedUpload } from './merged-upload';
import { AuditTrail } from './audit-trail';

/** The stack's hand-off on the stack page: its state, the steps this person may take, links, result, history. */
export function HandoffPanel({ stackId }: { stackId: string }) {
  const { studioId } = useActiveStudio();
  const handoff = useHandoff(studioId, stackId);
  return (
    <section aria-labelledby="handoff-h" className="rounded border border-rule bg-card p-4">
      <h2 id="handoff-h" className="text-lg font-semibold">Hand-off</h2>
      <QueryState isPending={handoff.isPending} error={handoff.error} label="hand-off">
        {handoff.data ? <HandoffBody studioId={studioId} view={handoff.data} /> : null}
      </QueryState>
    </section>
  );
}

function HandoffBody({ studioId, view }: { studioId: string; view: HandoffView }) {
  const qc = useQueryClient();
  const { stack, can } = view;
  const [newLink, setNewLink] = useState<NewShareLink | null>(null);
  const [confirmTakeBack, setConfirmTakeBack] = useState(false);
  const takeBack = useTakeBackStack(studioId, stack.id);
  const archive = useArchiveStack(studioId, stack.id);
  const uploaded = (r: { handoff: HandoffView; mergedResult: MergedResultView }) => {
    qc.setQueryData(handoffQueryOptions(studioId, stack.id).queryKey, r.handoff);
    void qc.invalidateQueries({ queryKey: ['studios', studioId, 'stacks', stack.id], exact: true });
  };

  return (
    <div className="mt-2 space-y-4" aria-live="polite">
      <p className="text-sm">
        <span className="rounded bg-moss/10 px-2 py-0.5 font-medium text-moss" data-testid="handoff-state">{STACK_STATE_LABELS[stack.state]}</span>
        {stack.handedTo && stack.state !== 'ready' ? (
          <span className="ml-2 text-slate">
            handed to <span className="text-ink">{stack.handedTo.name}</span>{stack.handedTo.kind === 'email' ? ' (outside, by share link)' : ''} on {when(stack.handedOffAt)}
          </span>
        ) : null}
        {stack.mergedAt ? <span className="ml-2 text-slate">· merged {when(stack.mergedAt)}</span> : null}
      </p>
      {stack.state === 'draft' ? <p className="text-sm text-slate">Check the stack and mark it ready before handing it off.</p> : null}

      {can.handOff ? <HandOffForm studioId={studioId} view={view} onHandedOff={(r) => setNewLink(r.shareLink)} /> : null}
      {newLink ? <NewLinkNotice link={newLink} onDismiss={() => setNewLink(null)} /> : null}
      {view.shareLinks.length > 0 || can.manageLinks ? (
        <ShareLinkList studioId={studioId} stackId={stack.id} links={view.shareLinks} canManage={can.manageLinks} onCreated={setNewLink} />
      ) : null}

      {view.mergedResult ? (
        <div className="space-y-1">
          <h3 className="text-sm font-semibold">Merged result</h3>
          <MergedResultCard
            result={view.mergedResult} stackName={stack.name}
            previewUrl={mergedPreviewUrl(studioId, stack.id, view.mergedResult.id)} fileUrl={mergedFileUrl(studioId, stack.id)}
          />
        </div>
      ) : null}
      {can.uploadMerged ? (
        <div className="space-y-1">
          <h3 className="text-sm font-semibold">Send back the merged result</h3>
          <MergedUpload url={memberMergedUrl(studioId, stack.id)} stackName={stack.name} onUploaded={uploaded} />
        </div>
      ) : null}

      {can.takeBack || can.archive ? (
        <div className="flex flex-wrap items-center gap-2">
          {can.takeBack && !confirmTakeBack ? <Button variant="secondary" onClick={() => setConfirmTakeBack(true)}>Take back…</Button> : null}
          {can.takeBack && confirmTakeBack ? (
            <span className="flex flex-wrap items-center gap-2 text-sm" role="group" aria-label="Confirm taking the hand-off back">
              Take it back from {stack.handedTo?.name}{view.shareLinks.some((l) => l.status === 'active') ? ' and revoke its share links' : ''}?
              <Button variant="danger" disabled={takeBack.isPending} onClick={() => takeBack.mutate(undefined, { onSettled: () => setConfirmTakeBack(false) })}>Take back</Button>
              <Button variant="quiet" onClick={() => setConfirmTakeBack(false)}>Keep it handed off</Button>
            </span>
          ) : null}
          {can.archive ? <Button variant="secondary" disabled={archive.isPending} onClick={() => archive.mutate(undefined)}>Archive the stack</Button> : null}
        </div>
      ) : null}
      {takeBack.error ? <ErrorNote error={takeBack.error} /> : null}
      {archive.error ? <ErrorNote error={archive.error} /> : null}

      <AuditTrail events={view.events} />
    </div>
  );
}
