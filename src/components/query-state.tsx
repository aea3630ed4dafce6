import type { ReactNode } from 'react';
import { ApiError } from '@/lib/api-client';

/** Loading and error states for a query, so every page shows one or the other consistently. */
export function QueryState({ isPending, error, children, label }: { isPending: boolean; error: unknown; children: ReactNode; label: string }) {
  if (isPending) return <p className="py-6 text-slate" role="status">Loading {label}…</p>;
  if (error) return <ErrorNote error={error} />;
  return <>{children}</>;
}

export function ErrorNote({ error }: { error: unknown }) {
  if (!error) return null;
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  const requestId = error instanceof ApiError ? error.requestId : undefined;
  return (
    <div role="alert" className="rounded border border-clay/40 bg-clay/5 px-3 py-2 text-sm text-clay">
      {message}
      {requestId ? <span className="ml-2 text-xs text-slate">(request {requestId.slice(0, 8)})</span> : null}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded border border-dashed border-rule px-6 py-10 text-center">
      <p className="font-medium text-ink">{title}</p>
      {children ? <div className="mt-2 text-sm text-slate">{children}</div> : null}
    </div>
  );
}

export function PageHeader({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-3 border-b border-rule pb-3">
      <h1 className="text-2xl font-semibold text-ink">{title}</h1>
      {children ? <div className="flex flex-wrap gap-2 no-print">{children}</div> : null}
    </div>
  );
}
