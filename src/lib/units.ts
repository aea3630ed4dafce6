// Numbers as photographers read them: a few significant figures, never scientific notation,
// whole numbers in full, and the unit always beside the number.
const sigFormat = new Map<number, Intl.NumberFormat>();

/** `digits` significant figures, but every digit of the whole part is kept (1004, not 1,000). */
export function sig(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const wholeDigits = Math.floor(Math.log10(Math.abs(x))) + 1;
  const fraction = Math.min(6, Math.max(0, digits - wholeDigits));
  if (!sigFormat.has(fraction)) sigFormat.set(fraction, new Intl.NumberFormat('en', { maximumFractionDigits: fraction, useGrouping: false }));
  return sigFormat.get(fraction)!.format(x);
}

export const fixed = (x: number, digits: number) => (Number.isFinite(x) ? x.toFixed(digits) : '—');
export const count = (n: number) => (Number.isFinite(n) ? new Intl.NumberFormat('en').format(n) : '—');

/** A length given in mm, shown in µm below 1 mm. */
export function length(mm: number | null): string {
  if (mm === null || !Number.isFinite(mm)) return '∞';
  return Math.abs(mm) < 1 ? `${sig(mm * 1000)} µm` : `${sig(mm)} mm`;
}

export function duration(s: number | null): string {
  if (s === null || !Number.isFinite(s)) return '—';
  if (s < 120) return `${sig(s)} s`;
  if (s < 7200) return `${sig(s / 60)} min`;
  return `${sig(s / 3600)} h`;
}

/** An exposure time as a fraction below ½ s (1/125 s), else in seconds. */
export function exposure(s: number): string {
  if (s > 0 && s < 0.5) return `1/${Math.round(1 / s)} s`;
  return `${sig(s)} s`;
}

export const fNumber = (n: number, digits = 2) => `f/${sig(n, digits)}`;
export const magnification = (m: number) => `${sig(m)}×`;
