import { Link, useParams } from 'react-router';
import { QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { usePlans } from '@/features/plans/api/get-plans';
import { useSession } from '@/features/sessions/api/get-session';
import { useSorting } from '@/features/sessions/api/get-sorting';
import { SessionDetails } from '@/features/sessions/components/session-details';
import { CardImportPanel } from '@/features/sessions/components/card-import-panel';
import { SortingPanel } from '@/features/sessions/components/sorting-panel';
import { FrameTable } from '@/features/sessions/components/frame-table';
import { paths } from '../paths';
import { RetoucherElsewhere } from '../layout/retoucher-elsewhere';

export function Component() {
  const { role } = useActiveStudio();
  return role === 'retoucher' ? <RetoucherElsewhere title="Session" /> : <Session />;
}

function Session() {
  const { sessionId = '' } = useParams();
  const { studioId, canEdit } = useActiveStudio();
  const session = useSession(studioId, sessionId);
  const sorting = useSorting(studioId, sessionId);
  const plans = usePlans(studioId);
  const planOptions = (plans.data ?? []).map((p) => ({ id: p.id, name: p.name }));
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to={paths.sessions} className="text-moss hover:underline">Sessions</Link>
      </nav>
      <QueryState isPending={session.isPending} error={session.error} label="session">
        {session.data ? (
          <>
            <SessionDetails studioId={studioId} session={session.data} canEdit={canEdit} />
            {canEdit ? <CardImportPanel key={sessionId} studioId={studioId} sessionId={sessionId} /> : null}
            <SortingPanel studioId={studioId} sessionId={sessionId} canEdit={canEdit} plans={planOptions} />
            <FrameTable studioId={studioId} sessionId={sessionId} view={sorting.data} />
          </>
        ) : null}
      </QueryState>
    </>
  );
}
