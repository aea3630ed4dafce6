import { useId, type ReactNode, type SelectHTMLAttributes } from 'react';

interface Props extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
  children: ReactNode;
}

export function SelectField({ label, error, className = '', id, children, ...rest }: Props) {
  const autoId = useId();
  const selectId = id ?? autoId;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={selectId} className="text-sm font-medium text-ink">{label}</label>
      <select id={selectId} aria-invalid={error ? true : undefined} className="rounded border border-rule bg-card px-2 py-1.5 text-ink focus:border-moss" {...rest}>
        {children}
      </select>
      {error ? <p role="alert" className="text-xs text-clay">{error}</p> : null}
    </div>
  );
}
