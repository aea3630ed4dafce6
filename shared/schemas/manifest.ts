import { z } from 'zod';

// The manifest written into every bundle (manifest.json; manifest.csv has one row per file).
// A retoucher's tools read it, so its shape is versioned.

export const sha256HexSchema = z.string().regex(/^[0-9a-f]{64}$/, 'sha256 must be 64 lower-case hex digits');

export const fileRoleSchema = z.enum(['raw', 'jpeg', 'other']);
export type FileRole = z.infer<typeof fileRoleSchema>;

export const manifestFileSchema = z.object({
  newName: z.string().min(1),
  originalName: z.string(),
  role: fileRoleSchema,
  sha256: sha256HexSchema,
  bytes: z.number().int().nonnegative(),
});
export type ManifestFile = z.infer<typeof manifestFileSchema>;

export const manifestFrameSchema = z.object({
  /** 1-based position in the bundle; the number in the new file names. */
  number: z.number().int().positive(),
  /** The frame's order in the stack as the app holds it (gaps where frames were excluded). */
  stackOrder: z.number().int().nonnegative(),
  captureTime: z.string().nullable(),
  exposureTimeS: z.number().positive().nullable(),
  fNumber: z.number().positive().nullable(),
  iso: z.number().positive().nullable(),
  focalLengthMm: z.number().positive().nullable(),
  flags: z.array(z.string()),
  files: z.array(manifestFileSchema).min(1),
});
export type ManifestFrame = z.infer<typeof manifestFrameSchema>;

export const manifestLegendEntrySchema = z.object({
  code: z.string().min(1),
  label: z.string(),
  meaning: z.string(),
  /** The glyph's shape name, as drawn on the contact sheet (e.g. 'half-filled-circle'). */
  glyph: z.string(),
  colourHex: z.string().regex(/^#[0-9A-Fa-f]{6}$/),
});
export type ManifestLegendEntry = z.infer<typeof manifestLegendEntrySchema>;

export const bundleManifestSchema = z.object({
  manifestVersion: z.literal(1),
  stackName: z.string(),
  folder: z.string().nullable(),
  generatedAt: z.iso.datetime({ offset: true }),
  frameCount: z.number().int().nonnegative(),
  frames: z.array(manifestFrameSchema),
  contactSheets: z.array(z.string()),
  plan: z.string().nullable(),
  legend: z.array(manifestLegendEntrySchema),
});
export type BundleManifest = z.infer<typeof bundleManifestSchema>;
