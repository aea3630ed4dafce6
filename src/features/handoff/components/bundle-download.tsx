import { useMutation } from '@tanstack/react-query';
import type { BundleAvailability } from '@shared/schemas/handoff';
import { Button } from '@/components/button';
import { ErrorNote } from '@/components/query-state';
import { bytes } from '../lib/format';

interface Props {
  status: BundleAvailability;
  sizeBytes: number | null;
  href: string;
  stackName: string;
  /** Asks for the bundle to be made; the list it sits in is read again afterwards. */
  ask: () => Promise<unknown>;
  onAsked: () => void;
}

/** The stack's bundle for the retoucher: a download when ready, else where it stands. */
export function BundleDownload({ status, sizeBytes, href, stackName, ask, onAsked }: Props) {
  const asking = useMutation({ mutationFn: ask, onSuccess: onAsked });
  if (status === 'ready') {
    return (
      <a href={href} download className="inline-flex items-center gap-1 rounded bg-moss px-3 py-1.5 text-sm font-medium text-white hover:bg-[#275d4f]">
        Download bundle<span className="sr-only"> of {stackName}</span> <span className="num font-normal">({bytes(sizeBytes)})</span>
      </a>
    );
  }
  return (
    <div className="space-y-1" aria-live="polite">
      {status === 'preparing' ? (
        <p className="text-sm text-slate" role="status">The bundle is being prepared; this page checks again by itself.</p>
      ) : (
        <>
          <p className="text-sm text-slate">No bundle is ready for this stack.</p>
          <Button variant="secondary" disabled={asking.isPending} onClick={() => asking.mutate()}>Prepare the bundle</Button>
        </>
      )}
      {asking.error ? <ErrorNote error={asking.error} /> : null}
    </div>
  );
}
