import { useState, type FormEvent } from 'react';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import type { SessionCreateInput } from '../api/create-session';

interface Props {
  initial?: Partial<SessionCreateInput>;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (values: SessionCreateInput) => void;
  onCancel?: () => void;
}

const today = () => new Date().toISOString().slice(0, 10);

/** Title, date, subject, location and notes of a shoot; the server checks the same schema. */
export function SessionForm({ initial = {}, submitLabel, pending, error, onSubmit, onCancel }: Props) {
  const [v, setV] = useState<SessionCreateInput>({ title: '', shootDate: today(), subject: '', location: '', notes: '', ...initial });
  const apiError = error instanceof ApiError ? error : null;
  const set = (key: keyof SessionCreateInput) => (e: { target: { value: string } }) => setV((x) => ({ ...x, [key]: e.target.value }));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSubmit(v);
  };
  return (
    <form onSubmit={submit} noValidate aria-label={submitLabel} className="grid gap-3 rounded border border-rule bg-card p-4 sm:grid-cols-2">
      <TextField label="Title" value={v.title} onChange={set('title')} error={apiError?.fieldError('title')} placeholder="e.g. Dew on the fern, morning" required />
      <TextField label="Date" type="date" value={v.shootDate} onChange={set('shootDate')} error={apiError?.fieldError('shootDate')} required />
      <TextField label="Subject" value={v.subject} onChange={set('subject')} error={apiError?.fieldError('subject')} placeholder="e.g. fern frond with dew" />
      <TextField label="Location" value={v.location} onChange={set('location')} error={apiError?.fieldError('location')} placeholder="e.g. studio bench" />
      <div className="flex flex-col gap-1 sm:col-span-2">
        <label htmlFor="session-notes" className="text-sm font-medium text-ink">Notes</label>
        <textarea id="session-notes" rows={3} value={v.notes} onChange={set('notes')} className="rounded border border-rule bg-card px-2 py-1.5 text-ink focus:border-moss" />
        {apiError?.fieldError('notes') ? <p role="alert" className="text-xs text-clay">{apiError.fieldError('notes')}</p> : null}
      </div>
      <div className="flex flex-wrap gap-2 sm:col-span-2">
        <Button type="submit" disabled={pending}>{submitLabel}</Button>
        {onCancel ? <Button variant="secondary" onClick={onCancel}>Cancel</Button> : null}
      </div>
      {error && !apiError?.details ? <div className="sm:col-span-2"><ErrorNote error={error} /></div> : null}
    </form>
  );
}
