// How the sessions pages print sizes, times and camera settings; every number with its unit.
import { duration, exposure, fNumber, sig } from '@/lib/units';
import { onCameraClock } from '@/lib/capture-time';

export function bytes(n: number): string {
  if (!Number.isFinite(n)) return '—';
  if (n < 1000) return `${n} B`;
  if (n < 1e6) return `${sig(n / 1e3)} kB`;
  if (n < 1e9) return `${sig(n / 1e6)} MB`;
  return `${sig(n / 1e9)} GB`;
}

const TIME: Intl.DateTimeFormatOptions = { hour: '2-digit', minute: '2-digit', second: '2-digit', fractionalSecondDigits: 1 };
const DATE_TIME: Intl.DateTimeFormatOptions = { dateStyle: 'medium', timeStyle: 'medium' };

/** Capture time of day with tenths of a second (frames of a burst are fractions of a second apart), on the camera's clock. */
export const captureTime = (ms: number | null, offsetMinutes?: number | null) => (ms === null ? 'no time' : onCameraClock(ms, offsetMinutes, TIME));
export const captureDateTime = (ms: number | null, offsetMinutes?: number | null) => (ms === null ? '—' : onCameraClock(ms, offsetMinutes, DATE_TIME));

export const shootDate = (isoDate: string) => new Date(`${isoDate}T12:00:00`).toLocaleDateString(undefined, { dateStyle: 'medium' });

export const shutter = (s: number | null) => (s === null ? '—' : exposure(s));
export const aperture = (n: number | null) => (n === null ? '—' : fNumber(n));
export const isoSpeed = (n: number | null) => (n === null ? '—' : `ISO ${n}`);
export const focal = (mm: number | null) => (mm === null ? '—' : `${sig(mm)} mm`);

/** Time from the first to the last capture. */
export function timeSpan(times: (number | null)[]): string {
  const known = times.filter((t): t is number => t !== null);
  if (known.length < 2) return '—';
  return duration((Math.max(...known) - Math.min(...known)) / 1000);
}

/** "f/8 · 100 mm · 1/125 s · ISO 200", with ranges where frames differ. */
export function settingsSummary(frames: { fNumber: number | null; focalLengthMm: number | null; exposureTimeS: number | null; iso: number | null }[]): string {
  const range = (values: (number | null)[], show: (v: number) => string) => {
    const known = [...new Set(values.filter((v): v is number => v !== null))].sort((a, b) => a - b);
    if (known.length === 0) return null;
    return known.length === 1 ? show(known[0]) : `${show(known[0])}–${show(known[known.length - 1])}`;
  };
  return [
    range(frames.map((f) => f.fNumber), (v) => fNumber(v)),
    range(frames.map((f) => f.focalLengthMm), (v) => `${sig(v)} mm`),
    range(frames.map((f) => f.exposureTimeS), exposure),
    range(frames.map((f) => f.iso), (v) => `ISO ${v}`),
  ].filter(Boolean).join(' · ') || 'no settings recorded';
}

export const START_REASONS: Record<string, string> = {
  first: 'first frames of the card',
  gap: 'after a pause in shooting',
  setting: 'aperture, focal length or orientation changed',
  body: 'frames of another camera body',
  split: 'split by hand',
};

/** What a frame or file flag means, in a few words. */
export const FLAG_LABELS: Record<string, string> = {
  'no-capture-time': 'no capture time (file time used)',
  'implausible-capture-time': 'implausible capture time',
  'not-placed': 'could not be placed by time or number',
  'exposure-change': 'exposure changed',
  'truncated-file': 'file is cut short',
  'metadata-unreadable': 'metadata unreadable',
  'too-large': 'too large to preview',
  'no-preview': 'no preview',
};
export const flagLabel = (code: string) => FLAG_LABELS[code] ?? code;
