import { Link } from 'react-router';
import type { StackDetailView } from '@shared/schemas/bundles';
import { count } from '@/lib/units';
import { paths } from '@/app/paths';
import { bytes, shootDate, STATE_LABELS, when } from '../lib/format';

const STATE_STYLE: Record<string, string> = {
  draft: 'border-slate/40 text-slate',
  ready: 'border-moss bg-moss/10 text-moss',
};

/** The stack's name, state, session, plan and counts. */
export function StackHeader({ stack, canSeeSessions }: { stack: StackDetailView; canSeeSessions: boolean }) {
  const { counts } = stack;
  return (
    <header className="mb-6 border-b border-rule pb-4">
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        {canSeeSessions ? (
          <>
            <Link to={paths.sessions} className="text-moss hover:underline">Sessions</Link>
            <span className="mx-1 text-slate" aria-hidden="true">›</span>
            <Link to={paths.session(stack.session.id)} className="text-moss hover:underline">{stack.session.title}</Link>
          </>
        ) : (
          <>
            <Link to={paths.handoffs} className="text-moss hover:underline">Handed to me</Link>
            <span className="mx-1 text-slate" aria-hidden="true">›</span>
            <span>{stack.session.title}</span>
          </>
        )}
        <span className="ml-2 text-slate">{shootDate(stack.session.shootDate)}</span>
      </nav>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <h1 className="text-2xl font-semibold text-ink">{stack.name}</h1>
        <span className={`rounded-full border px-2 py-0.5 text-xs font-medium ${STATE_STYLE[stack.state] ?? 'border-steel text-steel'}`}>{STATE_LABELS[stack.state] ?? stack.state}</span>
        <span className="num text-sm text-slate" title="Every edit of the stack makes a new version">version {stack.version}</span>
      </div>
      <dl className="num mt-3 flex flex-wrap gap-x-6 gap-y-1 text-sm">
        <div><dt className="inline text-slate">Frames </dt><dd className="inline font-medium">{count(counts.frames)}</dd></div>
        <div><dt className="inline text-slate">In the bundle </dt><dd className="inline font-medium">{count(counts.included)}</dd></div>
        <div><dt className="inline text-slate">Excluded </dt><dd className={`inline font-medium ${counts.excluded ? 'text-clay' : ''}`}>{count(counts.excluded)}</dd></div>
        <div><dt className="inline text-slate">Marked </dt><dd className="inline font-medium">{count(counts.flagged)}</dd></div>
        <div><dt className="inline text-slate">Originals </dt><dd className="inline font-medium">{bytes(counts.bytes)}</dd></div>
        <div>
          <dt className="inline text-slate">Plan </dt>
          <dd className="inline font-medium">{stack.plan ? <Link to={paths.plan(stack.plan.id)} className="text-moss hover:underline">{stack.plan.name}</Link> : 'none linked'}</dd>
        </div>
        {stack.handedTo ? (
          <div>
            <dt className="inline text-slate">Handed to </dt>
            <dd className="inline font-medium">{stack.handedTo.name ?? stack.handedTo.email ?? 'a retoucher'}{stack.handedTo.at ? <span className="font-normal text-slate"> on {when(stack.handedTo.at)}</span> : null}</dd>
          </div>
        ) : null}
      </dl>
    </header>
  );
}
