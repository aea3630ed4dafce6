import type { BundleView } from '@shared/schemas/bundles';
import { Button } from '@/components/button';
import { ErrorNote } from '@/components/query-state';
import { useBundle } from '../api/get-bundle';
import { useLatestSessionBundle } from '../api/get-session-bundle';
import { useRequestSessionBundle } from '../api/request-session-bundle';
import { BundleStatus } from './bundle-status';

interface Props {
  studioId: string;
  sessionId: string;
  sessionTitle: string;
}

/** For photographers: one zip of the whole session, a folder per stack past draft. */
export function SessionBundlePanel({ studioId, sessionId, sessionTitle }: Props) {
  const latest = useLatestSessionBundle(studioId, sessionId);
  const request = useRequestSessionBundle(studioId, sessionId);
  const known: BundleView | null = latest.data?.bundle ?? null;
  const followed = useBundle(studioId, known?.id ?? null, known);
  const bundle = followed.data ?? known;
  const current = !!bundle && !bundle.stale && bundle.status !== 'failed';
  return (
    <section aria-labelledby="session-bundle-h" className="rounded border border-rule bg-card p-4">
      <h2 id="session-bundle-h" className="text-lg font-semibold">Whole session</h2>
      <p className="text-sm text-slate">
        A session bundle holds every stack past draft (ready, handed off, merged or archived), one folder per stack. Draft stacks are left out: mark the ones you have checked ready first.
      </p>
      <div className="mt-3 space-y-3" aria-live="polite">
        {latest.error ? <ErrorNote error={latest.error} /> : null}
        {bundle ? (
          <>
            {bundle.stale ? <p className="rounded border border-amber/50 bg-amber/10 px-3 py-2 text-sm">A stack of the session changed since this bundle was asked for.</p> : null}
            <BundleStatus studioId={studioId} bundle={bundle} canDownload what={sessionTitle} />
          </>
        ) : null}
        {!current ? (
          <Button variant="secondary" disabled={request.isPending || latest.isPending} onClick={() => request.mutate()}>Bundle the session</Button>
        ) : null}
        {request.error ? <ErrorNote error={request.error} /> : null}
      </div>
    </section>
  );
}
