import { z } from 'zod';
import { KNOWN_CHECK_CODES } from './glyph-draw';

// What the JPEG and the PDF contact sheets share: their input, captions and header wording.

const optionalPositive = z.number().positive().nullish();

export const contactSheetInputSchema = z.object({
  header: z.object({
    sessionTitle: z.string(),
    stackName: z.string(),
    planName: z.string().nullish(),
    frameCount: z.number().int().nonnegative(),
    excludedCount: z.number().int().nonnegative(),
    flaggedCount: z.number().int().nonnegative(),
  }),
  frames: z.array(
    z.object({
      number: z.number().int().nonnegative(),
      smallPreviewPath: z.string().min(1),
      captureTimeIso: z.string().nullish(),
      exposureTimeS: optionalPositive,
      fNumber: optionalPositive,
      iso: optionalPositive,
      checkCodes: z.array(z.string()),
    }),
  ),
  columns: z.number().int().min(1).max(40).optional(),
});
export type ContactSheetInput = z.input<typeof contactSheetInputSchema>;
export type ContactSheetFrame = ContactSheetInput['frames'][number];

export function parseContactSheetInput(input: ContactSheetInput): z.output<typeof contactSheetInputSchema> {
  const parsed = contactSheetInputSchema.safeParse(input);
  if (!parsed.success) throw new Error(`contact sheet: invalid input\n${z.prettifyError(parsed.error)}`);
  return parsed.data;
}

/** Shutter time as photographers write it: 1/125 s below 0.3 s, else 0.5 s, 2 s, 30 s (common practice). */
export function formatExposureTime(seconds: number | null | undefined): string {
  if (!seconds || !Number.isFinite(seconds)) return '–';
  if (seconds < 0.3) return `1/${Math.round(1 / seconds)} s`;
  return `${seconds < 10 ? Number(seconds.toFixed(1)) : Math.round(seconds)} s`;
}

export function formatFNumber(fNumber: number | null | undefined): string {
  if (!fNumber || !Number.isFinite(fNumber)) return 'f/–';
  return `f/${Number(fNumber.toFixed(1))}`;
}

export function formatIso(iso: number | null | undefined): string {
  return iso && Number.isFinite(iso) ? `ISO ${Math.round(iso)}` : 'ISO –';
}

/**
 * The wall-clock time written in the ISO string (the camera's local time), with hundredths:
 * frames of a stack are often under a second apart. Read from the text, not through Date, so
 * the server's time zone cannot shift it.
 */
export function formatCaptureTime(captureTimeIso: string | null | undefined): string {
  const match = /T(\d{2}):(\d{2}):(\d{2})(?:[.,](\d+))?/.exec(captureTimeIso ?? '');
  if (!match) return 'time unknown';
  const [, hours, minutes, seconds, fraction] = match;
  const hundredths = fraction ? `.${fraction.padEnd(2, '0').slice(0, 2)}` : '';
  return `${hours}:${minutes}:${seconds}${hundredths}`;
}

export function captionLines(frame: ContactSheetFrame): { numberText: string; timeText: string; settingsText: string } {
  return {
    numberText: String(frame.number),
    timeText: formatCaptureTime(frame.captureTimeIso),
    settingsText: `${formatExposureTime(frame.exposureTimeS)}  ${formatFNumber(frame.fNumber)}  ${formatIso(frame.iso)}`,
  };
}

export function headerLines(header: ContactSheetInput['header']): { title: string; subtitle: string; counts: string } {
  const plural = (count: number, word: string) => `${count} ${word}${count === 1 ? '' : 's'}`;
  return {
    title: header.sessionTitle,
    subtitle: header.planName ? `${header.stackName} · plan: ${header.planName}` : header.stackName,
    counts: `${plural(header.frameCount, 'frame')} · ${header.excludedCount} excluded · ${header.flaggedCount} flagged`,
  };
}

/** Check codes in the order they first appear, for the legend. */
export function codesInUse(frames: ContactSheetFrame[]): string[] {
  return [...new Set(frames.flatMap((frame) => frame.checkCodes))];
}

/** Every check the app runs, then any other flag the frames carry: the same legend on each sheet. */
export function legendCodes(frames: ContactSheetFrame[]): string[] {
  return [...new Set([...KNOWN_CHECK_CODES, ...codesInUse(frames)])];
}

/** Roughly square sheets; at least 4 columns so the header has room. */
export function defaultColumns(frameCount: number): number {
  return Math.min(16, Math.max(4, Math.round(Math.sqrt(frameCount * 1.3))));
}

export function escapeXml(text: string): string {
  return (
    text
      // eslint-disable-next-line no-control-regex -- XML 1.0 forbids these characters
      .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F]/g, '')
      .replace(/&/g, '&amp;')
      .replace(/</g, '&lt;')
      .replace(/>/g, '&gt;')
      .replace(/"/g, '&quot;')
  );
}
