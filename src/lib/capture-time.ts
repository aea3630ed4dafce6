// Capture times on the camera's clock: photographers read a frame's time as the camera showed it,
// wherever the browser is. With the offset the camera recorded, the wall-clock time is the instant
// shifted by that offset and printed as UTC; without one, the browser's zone is the best guess.
const cache = new Map<string, Intl.DateTimeFormat>();

function format(options: Intl.DateTimeFormatOptions, utc: boolean): Intl.DateTimeFormat {
  const key = `${JSON.stringify(options)}|${utc}`;
  let f = cache.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat(undefined, { ...options, hour12: false, ...(utc ? { timeZone: 'UTC' } : {}) });
    cache.set(key, f);
  }
  return f;
}

/** "UTC+02:00", "UTC−05:30" or "UTC" for an offset in minutes. */
export function offsetLabel(offsetMinutes: number): string {
  if (offsetMinutes === 0) return 'UTC';
  const abs = Math.abs(offsetMinutes);
  return `UTC${offsetMinutes < 0 ? '−' : '+'}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

/** Formats an instant on the camera's clock when its offset is known, else in the browser's zone. */
export function onCameraClock(ms: number, offsetMinutes: number | null | undefined, options: Intl.DateTimeFormatOptions): string {
  const known = typeof offsetMinutes === 'number';
  return format(options, known).format(new Date(known ? ms + offsetMinutes * 60_000 : ms));
}

/** What a capture time's clock is, for a title or caption. */
export function clockNote(offsetMinutes: number | null | undefined): string {
  return typeof offsetMinutes === 'number' ? `camera time (${offsetLabel(offsetMinutes)})` : 'your browser’s time zone (the camera recorded no offset)';
}
