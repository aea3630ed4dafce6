import { Link, useParams } from 'react-router';
import { ErrorNote, PageHeader, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useQueryClient } from '@tanstack/react-query';
import { stackFramePreviewUrl, stackQueryOptions, useStack } from '@/features/stacks/api/get-stack';
import { StackHeader } from '@/features/stacks/components/stack-header';
import { StackFrameGrid } from '@/features/stacks/components/stack-frame-grid';
import { ContactSheetPanel } from '@/features/stacks/components/contact-sheet-panel';
import { StackBundlePanel } from '@/features/bundles/components/stack-bundle-panel';
import { SessionBundlePanel } from '@/features/bundles/components/session-bundle-panel';
import { HandoffPanel } from '@/features/handoff/components/handoff-panel';
import { StackChecksPanel } from '@/features/checks/components/stack-checks-panel';
import { ApiError } from '@/lib/api-client';
import { paths } from '../paths';

export function Component() {
  const { stackId = '' } = useParams();
  const { studioId, canEdit, role } = useActiveStudio();
  const stack = useStack(studioId, stackId);
  const qc = useQueryClient();
  const s = stack.data;
  if (stack.error) return <StackRefused error={stack.error} retoucher={role === 'retoucher'} />;
  return (
    <QueryState isPending={stack.isPending} error={null} label="stack">
      {s ? (
        <>
          <StackHeader stack={s} canSeeSessions={role !== 'retoucher'} />
          <div className="grid items-start gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <ContactSheetPanel studioId={studioId} stack={s} canEdit={canEdit} />
            <div className="min-w-0 space-y-4">
              <StackBundlePanel studioId={studioId} stack={s} canEdit={canEdit} canDownload={role !== 'guest'} />
              <HandoffPanel stackId={s.id} />
              <StackChecksPanel stackId={s.id} onResultsChanged={() => qc.invalidateQueries({ queryKey: stackQueryOptions(studioId, s.id).queryKey, exact: true })} />
              {canEdit ? <SessionBundlePanel studioId={studioId} sessionId={s.session.id} sessionTitle={s.session.title} /> : null}
            </div>
          </div>
          <StackFrameGrid frames={s.frames} stackName={s.name} previewUrl={(frameId) => stackFramePreviewUrl(studioId, s.id, frameId)} />
        </>
      ) : null}
    </QueryState>
  );
}

/** A stack this person may not open (a retoucher's draft stack) or that no longer exists: say so, and where to go. */
function StackRefused({ error, retoucher }: { error: unknown; retoucher: boolean }) {
  const status = error instanceof ApiError ? error.status : 0;
  return (
    <>
      <PageHeader title={status === 404 ? 'No such stack' : 'This stack cannot be opened'} />
      <ErrorNote error={error} />
      <p className="mt-3 text-sm">
        {retoucher
          ? <Link to={paths.handoffs} className="text-moss underline underline-offset-2">See the stacks handed to you</Link>
          : <Link to={paths.sessions} className="text-moss underline underline-offset-2">Back to the sessions</Link>}
      </p>
    </>
  );
}
