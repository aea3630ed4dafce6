import type { StackEventView } from '@shared/schemas/handoff';
import { describeEvent, when } from '../lib/format';

/** Who did what to the stack, and when, newest first. */
export function AuditTrail({ events }: { events: StackEventView[] }) {
  return (
    <div>
      <h3 className="text-sm font-semibold">History</h3>
      {events.length === 0 ? (
        <p className="text-sm text-slate">Nothing recorded yet.</p>
      ) : (
        <ol className="mt-1 max-h-64 space-y-1 overflow-y-auto text-sm" aria-label="Stack history, newest first">
          {events.map((e, i) => (
            <li key={`${e.at}-${i}`} className="grid grid-cols-[9.5rem_1fr] gap-2 border-b border-rule/60 pb-1">
              <time dateTime={e.at} className="num text-slate">{when(e.at)}</time>
              <span><strong className="font-medium">{e.actor || 'Someone'}</strong> {describeEvent(e)}</span>
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
