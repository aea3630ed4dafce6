import { sig } from '@/lib/units';

export function bytes(n: number | null): string {
  if (n === null || !Number.isFinite(n)) return '—';
  if (n < 1e6) return `${sig(n / 1e3)} kB`;
  if (n < 1e9) return `${sig(n / 1e6)} MB`;
  return `${sig(n / 1e9)} GB`;
}

const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short', hour12: false });
export const when = (iso: string | null) => (iso ? dateTimeFormat.format(new Date(iso)) : '—');
