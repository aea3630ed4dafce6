import { useParams } from 'react-router';
import { QueryState } from '@/components/query-state';
import { useShare } from '@/features/handoff/api/get-share';
import { ShareView } from '@/features/handoff/components/share-view';

/** The public page a share link opens, for a retoucher outside the studio (no account). */
export function Component() {
  const { token = '' } = useParams();
  const share = useShare(token);
  return (
    <main id="main" className="mx-auto max-w-4xl px-4 py-8">
      <p className="mb-4 text-lg font-semibold tracking-wide text-moss">Lamella</p>
      <div className="rounded-lg border border-rule bg-card p-6 shadow-sm">
        <QueryState isPending={share.isPending} error={share.error} label="the shared stack">
          {share.data ? <ShareView token={token} view={share.data} /> : null}
        </QueryState>
        {share.error ? <p className="mt-3 text-sm text-slate">Links expire or are withdrawn by the studio; ask them for a new one.</p> : null}
      </div>
    </main>
  );
}
