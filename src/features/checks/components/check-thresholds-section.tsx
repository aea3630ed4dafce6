import { useState, type FormEvent } from 'react';
import { checkThresholdsInputSchema, type CheckThresholds } from '@shared/schemas/checks';
import type { CheckThresholdsView } from '@shared/schemas/check-views';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote, QueryState } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { useCheckThresholds } from '../api/get-check-thresholds';
import { useUpdateCheckThresholds } from '../api/update-check-thresholds';

type Key = keyof CheckThresholds;

const FIELDS: { key: Key; label: string; unit: string; step: string; hint: string }[] = [
  { key: 'exposureJumpStops', label: 'Exposure jump', unit: 'stops', step: '0.05', hint: 'A frame this far off its neighbours is flagged. 1/3 stop already shows as a band in a merge.' },
  { key: 'focusGapStepRatio', label: 'Focus gap', unit: '× the usual step', step: '0.1', hint: 'A focus move this many times the stack’s usual step counts as a missed step.' },
  { key: 'focusCellMinContrast', label: 'Detail needed for focus', unit: '× sharpness range', step: '0.5', hint: 'Parts of the picture whose sharpness varies less than this over the stack are ignored (plain background).' },
  { key: 'duplicateChangeRatio', label: 'Duplicate frame', unit: 'of the usual change', step: '0.05', hint: 'Two frames that differ by less than this fraction of the usual frame-to-frame change are duplicates…' },
  { key: 'duplicateMaxStops', label: 'Duplicate exposure tolerance', unit: 'stops', step: '0.05', hint: '…provided their exposures differ by less than this.' },
  { key: 'planFrameTolerance', label: 'Plan frame tolerance', unit: 'frames', step: '1', hint: 'How many frames more or fewer than the linked plan pass without a plan-mismatch check.' },
];

/** The studio's check limits: everyone reads them; owners and photographers change them. */
export function CheckThresholdsSection({ studioId, canEdit }: { studioId: string; canEdit: boolean }) {
  const thresholds = useCheckThresholds(studioId);
  // kept here: the form below starts afresh from each saved set, the outcome of saving stays
  const save = useUpdateCheckThresholds(studioId);
  return (
    <section aria-labelledby="thresholds-h" className="mb-10">
      <h2 id="thresholds-h" className="mb-1 text-lg font-semibold">Stack check limits</h2>
      <p className="mb-3 text-sm text-slate">When a stack’s checks raise a problem. Empty fields use the default shown; every stack is checked again after a change.</p>
      <QueryState isPending={thresholds.isPending} error={thresholds.error} label="check limits">
        {thresholds.data ? <ThresholdsForm key={thresholds.data.updatedAt ?? 'defaults'} view={thresholds.data} canEdit={canEdit} save={save} /> : null}
      </QueryState>
    </section>
  );
}

function ThresholdsForm({ view, canEdit, save }: { view: CheckThresholdsView; canEdit: boolean; save: ReturnType<typeof useUpdateCheckThresholds> }) {
  const [text, setText] = useState<Record<Key, string>>(() => Object.fromEntries(FIELDS.map(({ key }) => [key, view.custom[key] === undefined ? '' : String(view.custom[key])])) as Record<Key, string>);
  const [localErrors, setLocalErrors] = useState<Partial<Record<Key, string>>>({});
  const serverError = save.error instanceof ApiError ? save.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const body = Object.fromEntries(FIELDS.filter(({ key }) => text[key].trim() !== '').map(({ key }) => [key, Number(text[key])]));
    // the same schema as the server, so the form and the route agree
    const parsed = checkThresholdsInputSchema.safeParse(body);
    if (!parsed.success) {
      setLocalErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setLocalErrors({});
    save.mutate(body as Partial<CheckThresholds>);
  };
  const reset = () => {
    setLocalErrors({});
    save.mutate({});
  };
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {FIELDS.map(({ key, label, unit, step, hint }) => (
          <TextField
            key={key}
            label={label}
            unit={unit}
            type="number"
            inputMode="decimal"
            step={step}
            placeholder={`default ${Number(view.defaults[key].toFixed(3))}`}
            value={text[key]}
            disabled={!canEdit}
            onChange={(e) => setText((t) => ({ ...t, [key]: e.target.value }))}
            error={localErrors[key] ?? serverError?.fieldError(key)}
            hint={hint}
          />
        ))}
      </div>
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" disabled={save.isPending}>Save limits</Button>
          <Button variant="secondary" onClick={reset} disabled={save.isPending}>Back to the defaults</Button>
          {save.isSuccess ? <p role="status" className="text-sm text-moss">Saved. Every stack is being checked again with these limits.</p> : null}
        </div>
      ) : (
        <p className="text-sm text-slate">Owners and photographers change these limits.</p>
      )}
      {save.error && !serverError?.details ? <ErrorNote error={save.error} /> : null}
    </form>
  );
}
