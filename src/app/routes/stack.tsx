import { useParams } from 'react-router';
import { QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { stackFramePreviewUrl, useStack } from '@/features/stacks/api/get-stack';
import { StackHeader } from '@/features/stacks/components/stack-header';
import { StackFrameGrid } from '@/features/stacks/components/stack-frame-grid';
import { ContactSheetPanel } from '@/features/stacks/components/contact-sheet-panel';
import { StackBundlePanel } from '@/features/bundles/components/stack-bundle-panel';
import { SessionBundlePanel } from '@/features/bundles/components/session-bundle-panel';
import { HandoffPanel } from '@/features/handoff/components/handoff-panel';
import { StackChecksPanel } from '@/features/checks/components/stack-checks-panel';

export function Component() {
  const { stackId = '' } = useParams();
  const { studioId, canEdit, role } = useActiveStudio();
  const stack = useStack(studioId, stackId);
  const s = stack.data;
  return (
    <QueryState isPending={stack.isPending} error={stack.error} label="stack">
      {s ? (
        <>
          <StackHeader stack={s} />
          <div className="grid items-start gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <ContactSheetPanel studioId={studioId} stack={s} canEdit={canEdit} />
            <div className="space-y-4">
              <StackBundlePanel studioId={studioId} stack={s} canEdit={canEdit} canDownload={role !== 'guest'} />
              <HandoffPanel stackId={s.id} />
              <StackChecksPanel stackId={s.id} />
              {canEdit ? <SessionBundlePanel studioId={studioId} sessionId={s.session.id} sessionTitle={s.session.title} /> : null}
            </div>
          </div>
          <StackFrameGrid frames={s.frames} stackName={s.name} previewUrl={(frameId) => stackFramePreviewUrl(studioId, s.id, frameId)} />
        </>
      ) : null}
    </QueryState>
  );
}
