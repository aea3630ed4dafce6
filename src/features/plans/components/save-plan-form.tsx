import { useState, type FormEvent } from 'react';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';

interface Props {
  initialName?: string;
  initialNotes?: string;
  /** When editing a saved plan: save over it, or as a new plan. */
  editing: boolean;
  disabled: boolean;
  pending: boolean;
  error: unknown;
  onSave: (meta: { name: string; notes: string }, asNew: boolean) => void;
}

/** Name and notes, then save; the server recomputes every figure. */
export function SavePlanForm({ initialName = '', initialNotes = '', editing, disabled, pending, error, onSave }: Props) {
  const [name, setName] = useState(initialName);
  const [notes, setNotes] = useState(initialNotes);
  const apiError = error instanceof ApiError ? error : null;
  const inputProblem = apiError?.details?.some((d) => d.path.startsWith('inputs.') || d.path.startsWith('kit.'));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const submitter = (e.nativeEvent as SubmitEvent).submitter;
    onSave({ name, notes }, submitter?.dataset.asNew === 'true');
  };
  return (
    <form onSubmit={submit} noValidate aria-label="Save plan" className="flex flex-col gap-3 rounded border border-rule bg-card p-4">
      <TextField label="Plan name" value={name} onChange={(e) => setName(e.target.value)} error={apiError?.fieldError('name')} placeholder="e.g. Dew on a fern frond" />
      <div className="flex flex-col gap-1">
        <label htmlFor="plan-notes" className="text-sm font-medium text-ink">Notes</label>
        <textarea id="plan-notes" rows={3} value={notes} onChange={(e) => setNotes(e.target.value)} className="rounded border border-rule bg-card px-2 py-1.5 text-ink focus:border-moss" />
        {apiError?.fieldError('notes') ? <p role="alert" className="text-xs text-clay">{apiError.fieldError('notes')}</p> : null}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <Button type="submit" disabled={disabled || pending}>{editing ? 'Save changes' : 'Save plan'}</Button>
        {editing ? <Button type="submit" variant="secondary" disabled={disabled || pending} data-as-new="true">Save as new plan</Button> : null}
        {disabled ? <span className="text-sm text-clay">Fix the marked fields to save.</span> : null}
      </div>
      {inputProblem ? <p role="alert" className="text-sm text-clay">The server refused some inputs; they are marked beside their fields.</p> : null}
      {error && !apiError?.details ? <ErrorNote error={error} /> : null}
    </form>
  );
}
