// How the stack page prints sizes, times and marks; every number with its unit.
import { sig } from '@/lib/units';
import { onCameraClock } from '@/lib/capture-time';

export function bytes(n: number | null): string {
  if (n === null || !Number.isFinite(n)) return '—';
  if (n < 1000) return `${n} B`;
  if (n < 1e6) return `${sig(n / 1e3)} kB`;
  if (n < 1e9) return `${sig(n / 1e6)} MB`;
  return `${sig(n / 1e9)} GB`;
}

const TIME: Intl.DateTimeFormatOptions = { hour: '2-digit', minute: '2-digit', second: '2-digit', fractionalSecondDigits: 1 };
const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short', hour12: false });

/** Time of day with tenths (frames of a stack are often fractions of a second apart), on the camera's clock. */
export const captureTime = (ms: number | null, offsetMinutes?: number | null) => (ms === null ? 'no time' : onCameraClock(ms, offsetMinutes, TIME));
export const when = (iso: string | null) => (iso ? dateTimeFormat.format(new Date(iso)) : '—');
export const shootDate = (isoDate: string) => new Date(`${isoDate}T12:00:00`).toLocaleDateString(undefined, { dateStyle: 'medium' });

/** Marks that are not one of the five checks, in words. */
const FLAG_WORDS: Record<string, string> = {
  'no-capture-time': 'no capture time',
  'implausible-capture-time': 'implausible capture time',
  'not-placed': 'not placed by time',
  'truncated-file': 'file cut short',
  'metadata-unreadable': 'metadata unreadable',
};
export const flagWords = (code: string) => FLAG_WORDS[code] ?? code.replace(/-/g, ' ');

export const STATE_LABELS: Record<string, string> = {
  draft: 'draft',
  ready: 'ready',
  'handed-off': 'handed off',
  merged: 'merged',
  archived: 'archived',
};
