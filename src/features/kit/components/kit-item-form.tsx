import { useState, type FormEvent } from 'react';
import { sensorPreset, type KitKind, type SensorFormat } from '@shared/kit-presets';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { SelectField } from '@/components/select-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { FORMAT_OPTIONS, formToInput, validate, type FormValues, type KindConfig } from './kit-kinds';

interface Props {
  config: KindConfig<KitKind>;
  initial: FormValues;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (input: Record<string, unknown>) => void;
  onCancel?: () => void;
}

/** Add or edit one kit item; checks with the server's schema first, then shows the server's answer per field. */
export function KitItemForm({ config, initial, submitLabel, pending, error, onSubmit, onCancel }: Props) {
  const [form, setForm] = useState<FormValues>(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const apiError = error instanceof ApiError ? error : null;
  const custom = form.sensorFormat === 'custom';

  const set = (key: string, value: string) => {
    setForm((f) => {
      const next = { ...f, [key]: value };
      const preset = key === 'sensorFormat' ? sensorPreset(value as SensorFormat) : undefined;
      if (preset) Object.assign(next, { sensorWidthMm: String(preset.widthMm), sensorHeightMm: String(preset.heightMm) });
      return next;
    });
    setErrors((e) => ({ ...e, [key]: '' }));
  };
  const fieldError = (key: string) =>
    errors[key] || Object.entries(errors).find(([p, m]) => p.startsWith(`${key}.`) && m)?.[1] ||
    apiError?.fieldError(key) || apiError?.details?.find((d) => d.path.startsWith(`${key}.`))?.message;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const input = formToInput(config, form);
    const found = validate(config.kind, input);
    setErrors(found);
    if (Object.keys(found).length === 0) onSubmit(input);
  };

  return (
    <form onSubmit={submit} noValidate aria-label={`${submitLabel} (${config.one})`} className="grid gap-3 rounded border border-rule bg-card p-4 sm:grid-cols-2 lg:grid-cols-3">
      {config.fields.map((f) =>
        f.type === 'format' ? (
          <SelectField key={f.key} label={f.label} value={form[f.key]} onChange={(e) => set(f.key, e.target.value)} error={fieldError(f.key)}>
            {FORMAT_OPTIONS.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
          </SelectField>
        ) : (
          <TextField
            key={f.key}
            label={f.label}
            unit={f.unit}
            hint={f.hint}
            value={form[f.key] ?? ''}
            inputMode={f.type === 'number' ? 'decimal' : undefined}
            readOnly={(f.key === 'sensorWidthMm' || f.key === 'sensorHeightMm') && !custom}
            onChange={(e) => set(f.key, e.target.value)}
            error={fieldError(f.key)}
          />
        ),
      )}
      <div className="flex flex-wrap items-end gap-2 sm:col-span-2 lg:col-span-3">
        <Button type="submit" disabled={pending}>{submitLabel}</Button>
        {onCancel ? <Button variant="secondary" onClick={onCancel}>Cancel</Button> : null}
        {error && !apiError?.details ? <ErrorNote error={error} /> : null}
      </div>
    </form>
  );
}
