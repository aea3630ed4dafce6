import { useId, type InputHTMLAttributes, type ReactNode } from 'react';

interface Props extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  unit?: string;
}

/** A labelled input with its unit, a hint and an error announced to screen readers. */
export function TextField({ label, error, hint, unit, className = '', id, ...rest }: Props) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const describedBy = [error ? `${inputId}-error` : null, hint ? `${inputId}-hint` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={inputId} className="text-sm font-medium text-ink">
        {label}
        {unit ? <> <span className="font-normal text-slate">({unit})</span></> : null}
      </label>
      <input
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`rounded border bg-card px-2 py-1.5 text-ink ${error ? 'border-clay' : 'border-rule'} focus:border-moss`}
        {...rest}
      />
      {hint ? <p id={`${inputId}-hint`} className="text-xs text-slate">{hint}</p> : null}
      {error ? <p id={`${inputId}-error`} role="alert" className="text-xs text-clay">{error}</p> : null}
    </div>
  );
}
