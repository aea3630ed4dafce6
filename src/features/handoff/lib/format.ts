import { sig } from '@/lib/units';
import type { StackEventView } from '@shared/schemas/handoff';

export function bytes(n: number | null): string {
  if (n === null || !Number.isFinite(n)) return '—';
  if (n < 1e6) return `${sig(n / 1e3)} kB`;
  if (n < 1e9) return `${sig(n / 1e6)} MB`;
  return `${sig(n / 1e9)} GB`;
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short', hour12: false });
export const when = (iso: string | null) => (iso ? dateTime.format(new Date(iso)) : '—');
/** A shoot date ("2026-05-14") as the reader writes dates; noon keeps it on the same day in every zone. */
export const shootDay = (isoDate: string) => new Date(`${isoDate}T12:00:00`).toLocaleDateString(undefined, { dateStyle: 'medium' });

/** "in 6 days", "in 5 h", or "expired". */
export function timeLeft(iso: string, now = Date.now()): string {
  const ms = Date.parse(iso) - now;
  if (ms <= 0) return 'expired';
  const hours = ms / 3_600_000;
  return hours < 48 ? `in ${Math.max(1, Math.round(hours))} h` : `in ${Math.round(hours / 24)} days`;
}

const str = (v: unknown) => (typeof v === 'string' ? v : '');
const num = (v: unknown) => (typeof v === 'number' ? v : 0);

/** One line of the audit trail, in words. */
export function describeEvent(e: StackEventView): string {
  const d = e.detail;
  const to = (d.to ?? {}) as Record<string, unknown>;
  switch (e.action) {
    case 'handed-off':
      return `handed the stack off to ${str(to.name) || str(to.email)}${d.expiresAt ? ` (share link until ${when(str(d.expiresAt))})` : ''}`;
    case 'taken-back': {
      const n = num(d.shareLinksRevoked);
      return `took the hand-off back${n ? ` and revoked ${n} share link${n === 1 ? '' : 's'}` : ''}`;
    }
    case 'share-link-created':
      return `made a share link for ${str(d.email)}, valid until ${when(str(d.expiresAt))}`;
    case 'share-link-revoked':
      return `revoked the share link of ${str(d.email)}`;
    case 'bundle-downloaded':
      return `downloaded the bundle${d.bytes ? ` (${bytes(num(d.bytes))})` : ''}${d.downloadCount ? `, download ${num(d.downloadCount)} through the link` : ''}`;
    case 'merged-uploaded':
      return `sent back the merged result ${str(d.fileName)} (${bytes(num(d.sizeBytes))})`;
    case 'archived':
      return 'archived the stack';
    case 'marked-ready':
      return 'checked the stack and marked it ready';
    case 'back-to-draft':
      return 'returned the stack to draft';
    case 'renamed':
      return `renamed the stack from “${str(d.from)}” to “${str(d.to)}”`;
    default:
      return e.action.replace(/-/g, ' ');
  }
}
