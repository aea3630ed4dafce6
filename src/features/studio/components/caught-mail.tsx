import { QueryState, EmptyState } from '@/components/query-state';
import { useCaughtMail } from '../api/get-caught-mail';

/** Development only: mail the local mail catcher kept for this studio's people. */
export function CaughtMail({ studioId }: { studioId: string }) {
  const mail = useCaughtMail(studioId, true);
  return (
    <QueryState isPending={mail.isPending} error={mail.error} label="caught mail">
      {mail.data?.length ? (
        <ul className="flex flex-col gap-3">
          {mail.data.map((m) => (
            <li key={m.id} className="rounded border border-rule bg-card p-3">
              <details>
                <summary className="cursor-pointer text-sm">
                  <span className="font-medium">{m.subject}</span>
                  <span className="ml-2 text-slate">to {m.to.join(', ')} · {new Date(m.receivedAt).toLocaleString()}</span>
                </summary>
                <pre className="mt-2 whitespace-pre-wrap break-all font-sans text-sm">{m.text}</pre>
              </details>
            </li>
          ))}
        </ul>
      ) : (
        <EmptyState title="No mail caught yet">Invitations, resets and hand-off notices land here while the local mail catcher runs.</EmptyState>
      )}
    </QueryState>
  );
}
