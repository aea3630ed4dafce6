import type { ReactNode } from 'react';

/** The narrow card used by sign-in, reset and invitation pages. */
export function AuthCard({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-sm rounded-lg border border-rule bg-card p-8 shadow-sm">
        <p className="mb-1 text-sm tracking-wide text-slate">Lamella</p>
        <h1 className="mb-6 text-xl font-semibold text-ink">{title}</h1>
        {children}
      </div>
    </main>
  );
}
