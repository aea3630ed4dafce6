import {
  bundleManifestSchema,
  type BundleManifest,
  type ManifestFrame,
  type ManifestLegendEntry,
} from '@shared/schemas/manifest';
import { glyphFor, KNOWN_CHECK_CODES } from './glyph-draw';

export function manifestLegend(frames: ManifestFrame[]): ManifestLegendEntry[] {
  const codes = new Set<string>(KNOWN_CHECK_CODES);
  for (const frame of frames) for (const flag of frame.flags) codes.add(flag);
  return [...codes].map((code) => {
    const glyph = glyphFor(code);
    return { code, label: glyph.label, meaning: glyph.meaning, glyph: glyph.shape, colourHex: glyph.colourHex };
  });
}

export function buildManifest(input: Omit<BundleManifest, 'manifestVersion' | 'legend' | 'frameCount'>): BundleManifest {
  return bundleManifestSchema.parse({
    manifestVersion: 1,
    ...input,
    frameCount: input.frames.length,
    legend: manifestLegend(input.frames),
  });
}

// RFC 4180 quoting; a text cell that a spreadsheet would run as a formula gets a leading
// apostrophe (OWASP "CSV injection"), since original file names come from outside.
function csvCell(value: string | number | null): string {
  if (value === null) return '';
  let text = String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const MANIFEST_CSV_COLUMNS = [
  'number',
  'new_name',
  'original_name',
  'role',
  'stack_order',
  'capture_time',
  'exposure_time_s',
  'f_number',
  'iso',
  'focal_length_mm',
  'flags',
  'sha256',
  'bytes',
] as const;

/** One row per file, so the RAW and the JPEG of a frame each have their checksum. */
export function manifestCsv(manifest: BundleManifest): string {
  const rows = [MANIFEST_CSV_COLUMNS.join(',')];
  for (const frame of manifest.frames) {
    for (const file of frame.files) {
      rows.push(
        [
          frame.number,
          file.newName,
          file.originalName,
          file.role,
          frame.stackOrder,
          frame.captureTime,
          frame.exposureTimeS,
          frame.fNumber,
          frame.iso,
          frame.focalLengthMm,
          frame.flags.join(';'),
          file.sha256,
          file.bytes,
        ]
          .map(csvCell)
          .join(','),
      );
    }
  }
  return `${rows.join('\r\n')}\r\n`;
}
