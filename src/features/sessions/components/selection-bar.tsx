import { useState } from 'react';
import type { SortingView } from '@shared/schemas/session-views';
import { Button } from '@/components/button';
import { count } from '@/lib/units';

interface Props {
  view: SortingView;
  selected: string[];
  busy: boolean;
  onMove: (toStackId: string | null) => void;
  onExclude: (excluded: boolean) => void;
  onSplit: (stackId: string, frameId: string) => void;
  onClear: () => void;
}

const LOOSE = 'loose';

/** What can be done with the selected frames: move, exclude or include, split a stack before one. */
export function SelectionBar({ view, selected, busy, onMove, onExclude, onSplit, onClear }: Props) {
  const [target, setTarget] = useState<string>(LOOSE);
  const single = selected.length === 1 ? selected[0] : null;
  const splitAt = single ? view.stacks.find((s) => s.frames.some((f) => f.id === single)) : undefined;
  const splitIndex = splitAt ? splitAt.frames.findIndex((f) => f.id === single) : -1;
  const canSplit = !!splitAt && splitIndex > 0 && (splitAt.state === 'draft' || splitAt.state === 'ready');
  const editableStacks = view.stacks.filter((s) => s.state === 'draft' || s.state === 'ready');
  const validTarget = target === LOOSE || editableStacks.some((s) => s.id === target);
  return (
    <div role="region" aria-label="Selected frames" className="sticky top-0 z-10 flex flex-wrap items-center gap-2 rounded border border-moss/50 bg-paper px-3 py-2 shadow-sm">
      <span className="num text-sm font-medium">{count(selected.length)} selected</span>
      <label className="flex items-center gap-2 text-sm">
        <span>Move to</span>
        <select value={validTarget ? target : LOOSE} onChange={(e) => setTarget(e.target.value)} className="rounded border border-rule bg-card px-2 py-1">
          <option value={LOOSE}>loose frames</option>
          {editableStacks.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
        </select>
      </label>
      <Button disabled={busy} onClick={() => onMove(validTarget && target !== LOOSE ? target : null)}>Move</Button>
      <Button variant="secondary" disabled={busy} onClick={() => onExclude(true)}>Exclude</Button>
      <Button variant="secondary" disabled={busy} onClick={() => onExclude(false)}>Include</Button>
      <Button
        variant="secondary"
        disabled={busy || !canSplit}
        title={single && !canSplit ? 'Pick a frame after the first one of a stack' : undefined}
        onClick={() => splitAt && single && onSplit(splitAt.id, single)}
      >
        Split stack before this frame
      </Button>
      <Button variant="quiet" onClick={onClear}>Clear selection</Button>
    </div>
  );
}
