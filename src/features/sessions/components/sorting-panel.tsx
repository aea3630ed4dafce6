import { useState } from 'react';
import { Button } from '@/components/button';
import { EmptyState, ErrorNote, QueryState } from '@/components/query-state';
import { count } from '@/lib/units';
import { useSorting } from '../api/get-sorting';
import { useSortingActions } from '../hooks/use-sorting-actions';
import { GapControl } from './gap-control';
import { SelectionBar } from './selection-bar';
import { StackRow, type PlanOption } from './stack-row';
import { FrameTile } from './frame-tile';

// Undo steps the server names after what caused them; the card import's step undoes only its grouping.
const UNDO_WORDING: Record<string, string> = { 'card import': 'grouping of the card import' };

interface Props {
  studioId: string;
  sessionId: string;
  canEdit: boolean;
  plans: PlanOption[];
}

/** The card sorted into stacks (rows) and loose frames, with every hand edit and undo. */
export function SortingPanel({ studioId, sessionId, canEdit, plans }: Props) {
  const sorting = useSorting(studioId, sessionId);
  const actions = useSortingActions(studioId, sessionId);
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const view = sorting.data;
  const previewUrl = (frameId: string) => `/api/studios/${studioId}/sessions/${sessionId}/frames/${frameId}/preview/small`;
  const toggle = (frameId: string) => setSelected((s) => {
    const next = new Set(s);
    if (next.has(frameId)) next.delete(frameId);
    else next.add(frameId);
    return next;
  });
  const clear = () => setSelected(new Set());
  const afterEdit = { onSuccess: clear };
  const busy = actions.pending;
  const pendingPreviews = view ? [...view.stacks.flatMap((s) => s.frames), ...view.loose].filter((f) => f.previewStatus === 'pending').length : 0;

  return (
    <section aria-labelledby="sorting-h" className="mb-8">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <h2 id="sorting-h" className="text-lg font-semibold">Stacks and loose frames</h2>
        {canEdit && view ? (
          <Button variant="secondary" disabled={busy || !view.undoLabel} onClick={() => actions.undo.mutate(undefined, afterEdit)}>
            {view.undoLabel ? `Undo: ${UNDO_WORDING[view.undoLabel] ?? view.undoLabel}` : 'Nothing to undo'}
          </Button>
        ) : null}
      </div>
      <QueryState isPending={sorting.isPending} error={sorting.error} label="the sorting">
        {view ? (
          <>
            {canEdit ? (
              <GapControl key={sessionId} options={view.groupingOptions} disabled={view.fileCount === 0} pending={actions.regroup.isPending} onRegroup={(o) => actions.regroup.mutate(o, afterEdit)} />
            ) : null}
            <div className="mt-3 space-y-2">
              <ErrorNote error={actions.error} />
              {pendingPreviews ? <p className="text-sm text-slate" role="status">Making previews: <span className="num">{count(pendingPreviews)}</span> to go.</p> : null}
              {canEdit && selected.size ? (
                <SelectionBar
                  view={view}
                  selected={[...selected]}
                  busy={busy}
                  onMove={(toStackId) => actions.move.mutate({ frameIds: [...selected], toStackId }, afterEdit)}
                  onExclude={(excluded) => actions.exclude.mutate({ frameIds: [...selected], excluded }, afterEdit)}
                  onSplit={(stackId, frameId) => actions.split.mutate({ stackId, frameId }, afterEdit)}
                  onClear={clear}
                />
              ) : null}
            </div>
            {view.fileCount === 0 ? (
              <div className="mt-4"><EmptyState title="No frames yet">Import a card above; its frames are sorted into stacks here.</EmptyState></div>
            ) : (
              <>
                <p className="num mt-3 text-sm text-slate">
                  {count(view.stacks.length)} stacks · {count(view.loose.length)} loose frames
                  {canEdit ? ' · select frames (Enter or Space) to move, exclude or split' : ''}
                </p>
                {view.stacks.length === 0 ? (
                  <div className="mt-3">
                    <EmptyState title="No stacks on this card yet">
                      {canEdit ? 'Every frame is loose. Loosen the gap rule above (a larger gap factor or a smaller “Smallest stack”), or undo the last change.' : 'Every frame is loose for now.'}
                    </EmptyState>
                  </div>
                ) : null}
                <ol className="mt-3 space-y-3" aria-label="Stacks">
                  {view.stacks.map((s, i) => (
                    <StackRow
                      key={s.id}
                      sessionId={sessionId}
                      stack={s}
                      isLast={i === view.stacks.length - 1}
                      canEdit={canEdit}
                      busy={busy}
                      plans={plans}
                      selected={selected}
                      previewUrl={previewUrl}
                      onToggle={toggle}
                      onRename={(name) => actions.update.mutate({ stackId: s.id, patch: { name } })}
                      onLinkPlan={(planId) => actions.update.mutate({ stackId: s.id, patch: { planId } })}
                      onState={(state) => actions.state.mutate({ stackId: s.id, state })}
                      onMergeNext={() => actions.merge.mutate(s.id, afterEdit)}
                    />
                  ))}
                </ol>
                <section aria-labelledby="loose-h" className="mt-6 rounded border border-dashed border-rule p-3">
                  <h3 id="loose-h" className="text-base font-semibold">Loose frames <span className="num font-normal text-slate">({count(view.loose.length)})</span></h3>
                  <p className="text-xs text-slate">Test shots and singles that belong to no stack.</p>
                  {view.loose.length ? (
                    <ol className="mt-3 flex flex-wrap gap-2" aria-label="Loose frames">
                      {view.loose.map((f, i) => (
                        <FrameTile key={f.id} frame={f} number={i + 1} context="the loose frames" previewUrl={previewUrl(f.id)} selected={selected.has(f.id)} selectable={canEdit} onToggle={() => toggle(f.id)} />
                      ))}
                    </ol>
                  ) : null}
                </section>
              </>
            )}
          </>
        ) : null}
      </QueryState>
    </section>
  );
}
