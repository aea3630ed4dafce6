// Sensor presets by format only (PRODUCT.md, "Kit"); sizes in mm as the formats are usually quoted.
export const SENSOR_FORMATS = ['full-frame', 'aps-c-23.5', 'aps-c-22.3', 'four-thirds', 'one-inch', 'custom'] as const;
export type SensorFormat = (typeof SENSOR_FORMATS)[number];

export interface SensorPreset {
  format: Exclude<SensorFormat, 'custom'>;
  label: string;
  widthMm: number;
  heightMm: number;
}

export const SENSOR_PRESETS: readonly SensorPreset[] = [
  { format: 'full-frame', label: 'Full frame (36 × 24)', widthMm: 36, heightMm: 24 },
  { format: 'aps-c-23.5', label: 'APS-C (23.5 × 15.6)', widthMm: 23.5, heightMm: 15.6 },
  { format: 'aps-c-22.3', label: 'APS-C (22.3 × 14.9)', widthMm: 22.3, heightMm: 14.9 },
  { format: 'four-thirds', label: 'Four Thirds (17.3 × 13.0)', widthMm: 17.3, heightMm: 13.0 },
  { format: 'one-inch', label: '1-inch (13.2 × 8.8)', widthMm: 13.2, heightMm: 8.8 },
];

export function sensorPreset(format: SensorFormat): SensorPreset | undefined {
  return SENSOR_PRESETS.find((p) => p.format === format);
}

export function sensorFormatLabel(format: SensorFormat): string {
  return sensorPreset(format)?.label ?? 'Custom size';
}

/** The preset whose size matches (to 0.05 mm), or 'custom'. */
export function formatOfSize(widthMm: number, heightMm: number): SensorFormat {
  const match = SENSOR_PRESETS.find((p) => Math.abs(p.widthMm - widthMm) < 0.05 && Math.abs(p.heightMm - heightMm) < 0.05);
  return match?.format ?? 'custom';
}

export const KIT_KINDS = ['bodies', 'lenses', 'extension-sets', 'rails'] as const;
export type KitKind = (typeof KIT_KINDS)[number];

export const KIT_KIND_LABELS: Record<KitKind, { one: string; many: string }> = {
  bodies: { one: 'body', many: 'Bodies' },
  lenses: { one: 'lens', many: 'Lenses' },
  'extension-sets': { one: 'extension set', many: 'Extension sets' },
  rails: { one: 'rail', many: 'Rails' },
};
