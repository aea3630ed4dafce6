import { Suspense } from 'react';
import { Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-out';
import { StudioSwitcher } from '@/features/auth/components/studio-switcher';
import { ROLE_LABELS, type Role } from '@shared/roles';
import { paths } from '../paths';

const SECTIONS: { to: string; label: string; roles?: Role[] }[] = [
  { to: paths.planner, label: 'Planner' },
  { to: paths.sessions, label: 'Sessions', roles: ['owner', 'photographer', 'guest'] },
  { to: paths.kit, label: 'Kit' },
  { to: paths.studio, label: 'Studio' },
  { to: paths.handoffs, label: 'Handed to me', roles: ['retoucher'] },
];

/** Signed-in frame: top bar with sections, studio switcher and sign-out; pages render below. */
export function AppShell() {
  const { data: me, isPending, error } = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  if (isPending) return <p className="p-8 text-slate" role="status">Loading…</p>;
  if (error) return <p className="p-8 text-clay" role="alert">Lamella cannot reach its server: {error.message}</p>;
  if (!me) return <Navigate to={`${paths.signIn}?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  const active = me.studios.find((s) => s.id === me.activeStudioId);

  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-card focus:p-2">Skip to content</a>
      <header className="no-print border-b border-rule bg-card">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <span className="text-lg font-semibold tracking-wide text-moss">Lamella</span>
          <nav aria-label="Sections" className="flex flex-wrap gap-1">
            {SECTIONS.filter((s) => !s.roles || (active && s.roles.includes(active.role))).map((s) => (
              <NavLink
                key={s.to}
                to={s.to}
                className={({ isActive }) => `rounded px-3 py-1.5 text-sm ${isActive ? 'bg-moss/10 font-medium text-moss' : 'text-ink hover:bg-rule/40'}`}
              >
                {s.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <StudioSwitcher me={me} />
            {active ? <span className="text-slate">{ROLE_LABELS[active.role]}</span> : null}
            <span className="hidden text-slate sm:inline">{me.name}</span>
            <button
              type="button"
              className="text-moss hover:underline"
              onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(paths.signIn) })}
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-4 py-6">
        {active ? (
          <Suspense fallback={<p className="text-slate" role="status">Loading…</p>}>
            <Outlet />
          </Suspense>
        ) : (
          <NoStudio />
        )}
      </main>
    </div>
  );
}

function NoStudio() {
  return (
    <div className="mx-auto max-w-md py-16 text-center">
      <h1 className="text-xl font-semibold">You are not in a studio yet</h1>
      <p className="mt-2 text-slate">Ask a studio owner for an invitation, or create a studio of your own from the studio menu above.</p>
    </div>
  );
}
