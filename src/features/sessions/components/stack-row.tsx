import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import type { StackView } from '@shared/schemas/session-views';
import { Button } from '@/components/button';
import { count } from '@/lib/units';
import { paths } from '@/app/paths';
import { settingsSummary, START_REASONS, timeSpan } from '../lib/format';
import { FrameTile } from './frame-tile';

export interface PlanOption {
  id: string;
  name: string;
}

interface Props {
  sessionId: string;
  stack: StackView;
  isLast: boolean;
  canEdit: boolean;
  busy: boolean;
  plans: PlanOption[];
  selected: Set<string>;
  previewUrl: (frameId: string) => string;
  onToggle: (frameId: string) => void;
  onRename: (name: string) => void;
  onLinkPlan: (planId: string | null) => void;
  onState: (state: 'draft' | 'ready') => void;
  onMergeNext: () => void;
}

const STATE_STYLE: Record<string, string> = {
  draft: 'border-slate/40 text-slate',
  ready: 'border-moss bg-moss/10 text-moss',
};

/** One stack: its name, state, figures and frames in order, with the edits a person may make. */
export function StackRow({ sessionId, stack, isLast, canEdit, busy, plans, selected, previewUrl, onToggle, onRename, onLinkPlan, onState, onMergeNext }: Props) {
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(stack.name);
  const editable = canEdit && (stack.state === 'draft' || stack.state === 'ready');
  const excluded = stack.frames.filter((f) => f.excluded).length;
  const headingId = `stack-${stack.id}-h`;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onRename(name);
    setRenaming(false);
  };
  return (
    <li aria-labelledby={headingId} className="rounded border border-rule bg-card p-3" data-testid="stack-row">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        {renaming ? (
          <form onSubmit={submit} className="flex items-center gap-2" aria-label={`Rename ${stack.name}`}>
            <label htmlFor={`${headingId}-name`} className="sr-only">New name for {stack.name}</label>
            <input id={`${headingId}-name`} value={name} maxLength={120} onChange={(e) => setName(e.target.value)} className="rounded border border-rule px-2 py-1 text-sm" autoFocus />
            <Button type="submit" disabled={busy || !name.trim()}>Save name</Button>
            <Button variant="quiet" onClick={() => { setRenaming(false); setName(stack.name); }}>Cancel</Button>
          </form>
        ) : (
          <h3 id={headingId} className="text-base font-semibold">
            <Link to={paths.stack(sessionId, stack.id)} className="text-ink underline decoration-rule underline-offset-4 hover:text-moss hover:decoration-moss" title="Open the stack page: contact sheet, checks, bundle and hand-off">
              {stack.name}
            </Link>
          </h3>
        )}
        <span className={`rounded-full border px-2 py-0.5 text-xs font-medium ${STATE_STYLE[stack.state] ?? 'border-steel text-steel'}`}>{stack.state}</span>
        <span className="num text-sm">{count(stack.frames.length)} frames{excluded ? <span className="text-clay"> ({count(excluded)} excluded)</span> : null}</span>
        <span className="num text-sm text-slate" title="From the first to the last capture">span {timeSpan(stack.frames.map((f) => f.captureTimeMs))}</span>
        <span className="num text-sm text-slate">{settingsSummary(stack.frames)}</span>
        <span className="text-xs text-slate">starts: {START_REASONS[stack.startReason] ?? stack.startReason}</span>
      </div>

      {canEdit ? (
        <div className="mt-2 flex flex-wrap items-center gap-2">
          {!editable ? <span className="text-sm text-slate">This stack is {stack.state.replace('-', ' ')}; it is no longer edited here.</span> : null}
          {editable && !renaming ? <Button variant="secondary" disabled={busy} onClick={() => { setName(stack.name); setRenaming(true); }} aria-label={`Rename (${stack.name})`}>Rename</Button> : null}
          {editable ? (
            stack.state === 'draft'
              ? <Button disabled={busy} onClick={() => onState('ready')} aria-label={`Mark ready (${stack.name})`}>Mark ready</Button>
              : <Button variant="secondary" disabled={busy} onClick={() => onState('draft')} aria-label={`Back to draft (${stack.name})`}>Back to draft</Button>
          ) : null}
          {editable ? <Button variant="secondary" disabled={busy || isLast} onClick={onMergeNext} aria-label={`Merge with next (${stack.name})`}>Merge with next</Button> : null}
          <label className="flex items-center gap-2 text-sm">
            <span className="text-slate">Plan</span>
            <select
              value={stack.planId ?? ''}
              disabled={!editable || busy}
              onChange={(e) => onLinkPlan(e.target.value || null)}
              className="max-w-[16rem] rounded border border-rule bg-card px-2 py-1"
              aria-label={`Plan linked to ${stack.name}`}
            >
              <option value="">no plan</option>
              {plans.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
              {stack.planId && !plans.some((p) => p.id === stack.planId) ? <option value={stack.planId}>a plan no longer listed</option> : null}
            </select>
          </label>
        </div>
      ) : stack.planId ? (
        <p className="mt-1 text-sm text-slate">Plan: {plans.find((p) => p.id === stack.planId)?.name ?? 'linked'}</p>
      ) : null}

      <ol className="mt-3 flex flex-wrap gap-2" aria-label={`Frames of ${stack.name}`}>
        {stack.frames.map((f, i) => (
          <FrameTile
            key={f.id}
            frame={f}
            number={i + 1}
            context={stack.name}
            previewUrl={previewUrl(f.id)}
            selected={selected.has(f.id)}
            selectable={editable}
            onToggle={() => onToggle(f.id)}
          />
        ))}
      </ol>
    </li>
  );
}
