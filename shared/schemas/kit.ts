import { z } from 'zod';
import { SENSOR_FORMATS, sensorPreset, type KitKind } from '../kit-presets';

// Ranges match planInputSchema so anything in the kit can feed a plan.
const name = z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Use at most 120 characters.');
const num = (what: string) => z.number({ error: `Enter ${what} as a number.` });

const bodyFields = z.object({
  name,
  sensorFormat: z.enum(SENSOR_FORMATS, { error: 'Pick a sensor format, or Custom size.' }),
  sensorWidthMm: num('the sensor width').positive('The sensor width must be above 0 mm.').max(200, 'The sensor width must be at most 200 mm.').optional(),
  sensorHeightMm: num('the sensor height').positive('The sensor height must be above 0 mm.').max(200, 'The sensor height must be at most 200 mm.').optional(),
  pixelsAcross: num('the pixels across').int('Pixels across is a whole number.').min(100, 'Pixels across must be at least 100.').max(100_000, 'Pixels across must be at most 100 000.'),
});

/** A preset format fixes the sensor size; a custom size needs both dimensions. */
export const bodyInputSchema = bodyFields
  .superRefine((b, ctx) => {
    if (b.sensorFormat !== 'custom') return;
    if (b.sensorWidthMm === undefined) ctx.addIssue({ code: 'custom', path: ['sensorWidthMm'], message: 'Enter the sensor width for a custom size.' });
    if (b.sensorHeightMm === undefined) ctx.addIssue({ code: 'custom', path: ['sensorHeightMm'], message: 'Enter the sensor height for a custom size.' });
  })
  .transform((b) => {
    const preset = sensorPreset(b.sensorFormat);
    return { ...b, sensorWidthMm: preset?.widthMm ?? (b.sensorWidthMm as number), sensorHeightMm: preset?.heightMm ?? (b.sensorHeightMm as number) };
  });
export const bodyPatchSchema = bodyFields.partial();

const lensFields = z.object({
  name,
  focalLengthMm: num('the focal length').min(1, 'The focal length must be at least 1 mm.').max(2000, 'The focal length must be at most 2000 mm.'),
  widestFNumber: num('the widest f-number').min(0.5, 'The widest f-number must be at least 0.5.').max(128, 'The widest f-number must be at most 128.'),
  narrowestFNumber: num('the narrowest f-number').min(0.5, 'The narrowest f-number must be at least 0.5.').max(128, 'The narrowest f-number must be at most 128.'),
  maxMagnification: num('the maximum magnification').min(0, 'The maximum magnification cannot be negative.').max(200, 'The maximum magnification must be at most 200×.'),
  pupilMagnification: num('the pupil magnification').min(0.05, 'The pupil magnification must be at least 0.05.').max(20, 'The pupil magnification must be at most 20.'),
});
export const lensInputSchema = lensFields
  .extend({ pupilMagnification: lensFields.shape.pupilMagnification.default(1) })
  .refine((l) => l.narrowestFNumber >= l.widestFNumber, {
    path: ['narrowestFNumber'],
    message: 'The narrowest f-number must be at least the widest one (f/22 is narrower than f/2.8).',
  });
export const lensPatchSchema = lensFields.partial();

const extensionSetFields = z.object({
  name,
  tubeLengthsMm: z
    .array(num('each tube length').positive('Each tube must be longer than 0 mm.').max(500, 'Each tube must be at most 500 mm.'), { error: 'List the tube lengths in mm.' })
    .min(1, 'List at least one tube length.')
    .max(12, 'List at most 12 tubes.'),
});
export const extensionSetInputSchema = extensionSetFields;
export const extensionSetPatchSchema = extensionSetFields.partial();

const railFields = z.object({
  name,
  travelMm: num('the travel').positive('The travel must be above 0 mm.').max(1000, 'The travel must be at most 1000 mm.'),
  smallestStepUm: num('the smallest step').min(0.01, 'The smallest step must be at least 0.01 µm.').max(10_000, 'The smallest step must be at most 10 000 µm (10 mm).'),
});
export const railInputSchema = railFields.refine((r) => r.smallestStepUm / 1000 <= r.travelMm, {
  path: ['smallestStepUm'],
  message: 'The smallest step cannot be longer than the travel.',
});
export const railPatchSchema = railFields.partial();

export const KIT_SCHEMAS = {
  bodies: { input: bodyInputSchema, patch: bodyPatchSchema },
  lenses: { input: lensInputSchema, patch: lensPatchSchema },
  'extension-sets': { input: extensionSetInputSchema, patch: extensionSetPatchSchema },
  rails: { input: railInputSchema, patch: railPatchSchema },
} as const satisfies Record<KitKind, unknown>;

export type BodyInput = z.input<typeof bodyInputSchema>;
export type LensInput = z.input<typeof lensInputSchema>;
export type ExtensionSetInput = z.input<typeof extensionSetInputSchema>;
export type RailInput = z.input<typeof railInputSchema>;

interface Stamped { id: string; updatedAt: string }
export type Body = z.output<typeof bodyInputSchema> & Stamped;
export type Lens = z.output<typeof lensInputSchema> & Stamped;
export type ExtensionSet = z.output<typeof extensionSetInputSchema> & Stamped;
export type Rail = z.output<typeof railInputSchema> & Stamped;

export interface KitItems {
  bodies: Body;
  lenses: Lens;
  'extension-sets': ExtensionSet;
  rails: Rail;
}
export interface KitInputs {
  bodies: BodyInput;
  lenses: LensInput;
  'extension-sets': ExtensionSetInput;
  rails: RailInput;
}

/** Everything a studio owns, for the planner and the kit page. */
export interface Kit {
  bodies: Body[];
  lenses: Lens[];
  extensionSets: ExtensionSet[];
  rails: Rail[];
}
