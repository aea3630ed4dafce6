import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';
const styles: Record<Variant, string> = {
  primary: 'bg-moss text-white hover:bg-[#275d4f] disabled:bg-slate/50',
  secondary: 'border border-rule bg-card text-ink hover:border-slate disabled:text-slate',
  danger: 'border border-clay text-clay bg-card hover:bg-clay hover:text-white',
  quiet: 'text-moss underline-offset-2 hover:underline',
};

export function Button({ variant = 'primary', className = '', type = 'button', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex items-center justify-center gap-2 rounded px-3 py-1.5 text-sm font-medium transition-colors disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...rest}
    />
  );
}
