import type { ReactNode } from 'react';
import type { z } from 'zod';
import { SENSOR_PRESETS, sensorFormatLabel, type KitKind } from '@shared/kit-presets';
import { KIT_SCHEMAS, type Kit, type KitItems } from '@shared/schemas/kit';
import { fNumber, sig } from '@/lib/units';

export type FormValues = Record<string, string>;

export interface FieldDef {
  key: string;
  label: string;
  unit?: string;
  hint?: string;
  type?: 'text' | 'number' | 'list' | 'format';
}

export interface Column<K extends KitKind> {
  header: string;
  cell: (item: KitItems[K]) => ReactNode;
  numeric?: boolean;
}

export interface KindConfig<K extends KitKind> {
  kind: K;
  listKey: keyof Kit;
  title: string;
  one: string;
  fields: FieldDef[];
  empty: FormValues;
  toForm: (item: KitItems[K]) => FormValues;
  columns: Column<K>[];
}

/** '' → undefined (zod then asks for the value); a decimal comma is accepted. */
export function toNumber(s: string | undefined): number | undefined {
  const t = (s ?? '').trim().replace(',', '.');
  return t === '' ? undefined : Number(t);
}

const toList = (s: string | undefined) => (s ?? '').split(/[\s,;+]+/).filter(Boolean).map(Number);

/** Form strings to the request body, typed by each field's definition. */
export function formToInput(config: KindConfig<KitKind>, form: FormValues): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of config.fields) {
    const v = form[f.key];
    out[f.key] = f.type === 'number' ? toNumber(v) : f.type === 'list' ? toList(v) : v;
  }
  if (out.sensorFormat && out.sensorFormat !== 'custom') {
    delete out.sensorWidthMm;
    delete out.sensorHeightMm;
  }
  return out;
}

/** The same schema the server uses; first message per field path. */
export function validate(kind: KitKind, input: unknown): Record<string, string> {
  const res = (KIT_SCHEMAS[kind].input as z.ZodType).safeParse(input);
  const errors: Record<string, string> = {};
  if (!res.success) for (const i of res.error.issues) errors[i.path.join('.')] ??= i.message;
  return errors;
}

const str = (n: number) => String(n);

const bodies: KindConfig<'bodies'> = {
  kind: 'bodies', listKey: 'bodies', title: 'Bodies', one: 'body',
  fields: [
    { key: 'name', label: 'Name', hint: 'By format, e.g. “APS-C body (10 MP)”.' },
    { key: 'sensorFormat', label: 'Sensor format', type: 'format' },
    { key: 'sensorWidthMm', label: 'Sensor width', unit: 'mm', type: 'number' },
    { key: 'sensorHeightMm', label: 'Sensor height', unit: 'mm', type: 'number' },
    { key: 'pixelsAcross', label: 'Pixels across', unit: 'px', type: 'number' },
  ],
  empty: { name: '', sensorFormat: 'full-frame', sensorWidthMm: '36', sensorHeightMm: '24', pixelsAcross: '' },
  toForm: (b) => ({ name: b.name, sensorFormat: b.sensorFormat, sensorWidthMm: str(b.sensorWidthMm), sensorHeightMm: str(b.sensorHeightMm), pixelsAcross: str(b.pixelsAcross) }),
  columns: [
    { header: 'Name', cell: (b) => b.name },
    { header: 'Sensor', cell: (b) => `${sensorFormatLabel(b.sensorFormat).replace(/ \(.*\)$/, '')} · ${sig(b.sensorWidthMm)} × ${sig(b.sensorHeightMm)} mm` },
    { header: 'Pixels across', cell: (b) => `${b.pixelsAcross} px`, numeric: true },
    { header: 'Pixel pitch', cell: (b) => `${sig((b.sensorWidthMm / b.pixelsAcross) * 1000)} µm`, numeric: true },
  ],
};

const lenses: KindConfig<'lenses'> = {
  kind: 'lenses', listKey: 'lenses', title: 'Lenses', one: 'lens',
  fields: [
    { key: 'name', label: 'Name' },
    { key: 'focalLengthMm', label: 'Focal length', unit: 'mm', type: 'number' },
    { key: 'widestFNumber', label: 'Widest f-number', unit: 'f/', type: 'number' },
    { key: 'narrowestFNumber', label: 'Narrowest f-number', unit: 'f/', type: 'number' },
    { key: 'maxMagnification', label: 'Native maximum magnification', unit: '×', type: 'number', hint: '1 for a 1:1 macro lens; about 0.1–0.2 for most others.' },
    { key: 'pupilMagnification', label: 'Pupil magnification', unit: '×', type: 'number', hint: 'Exit ÷ entrance pupil diameter; 1 for a symmetric lens.' },
  ],
  empty: { name: '', focalLengthMm: '', widestFNumber: '', narrowestFNumber: '', maxMagnification: '', pupilMagnification: '1' },
  toForm: (l) => ({ name: l.name, focalLengthMm: str(l.focalLengthMm), widestFNumber: str(l.widestFNumber), narrowestFNumber: str(l.narrowestFNumber), maxMagnification: str(l.maxMagnification), pupilMagnification: str(l.pupilMagnification) }),
  columns: [
    { header: 'Name', cell: (l) => l.name },
    { header: 'Focal length', cell: (l) => `${sig(l.focalLengthMm)} mm`, numeric: true },
    { header: 'Apertures', cell: (l) => `${fNumber(l.widestFNumber)} – ${fNumber(l.narrowestFNumber)}`, numeric: true },
    { header: 'Max. magnification', cell: (l) => `${sig(l.maxMagnification)}×`, numeric: true },
    { header: 'Pupil magnification', cell: (l) => `${sig(l.pupilMagnification)}×`, numeric: true },
  ],
};

const extensionSets: KindConfig<'extension-sets'> = {
  kind: 'extension-sets', listKey: 'extensionSets', title: 'Extension sets', one: 'extension set',
  fields: [
    { key: 'name', label: 'Name' },
    { key: 'tubeLengthsMm', label: 'Tube lengths', unit: 'mm', type: 'list', hint: 'Separated by commas, e.g. 12, 20, 36.' },
  ],
  empty: { name: '', tubeLengthsMm: '' },
  toForm: (s) => ({ name: s.name, tubeLengthsMm: s.tubeLengthsMm.join(', ') }),
  columns: [
    { header: 'Name', cell: (s) => s.name },
    { header: 'Tubes', cell: (s) => `${s.tubeLengthsMm.map((t) => sig(t)).join(' + ')} mm`, numeric: true },
    { header: 'All together', cell: (s) => `${sig(s.tubeLengthsMm.reduce((a, b) => a + b, 0))} mm`, numeric: true },
  ],
};

const rails: KindConfig<'rails'> = {
  kind: 'rails', listKey: 'rails', title: 'Rails', one: 'rail',
  fields: [
    { key: 'name', label: 'Name' },
    { key: 'travelMm', label: 'Travel', unit: 'mm', type: 'number' },
    { key: 'smallestStepUm', label: 'Smallest step', unit: 'µm', type: 'number' },
  ],
  empty: { name: '', travelMm: '', smallestStepUm: '' },
  toForm: (r) => ({ name: r.name, travelMm: str(r.travelMm), smallestStepUm: str(r.smallestStepUm) }),
  columns: [
    { header: 'Name', cell: (r) => r.name },
    { header: 'Travel', cell: (r) => `${sig(r.travelMm)} mm`, numeric: true },
    { header: 'Smallest step', cell: (r) => `${sig(r.smallestStepUm)} µm`, numeric: true },
  ],
};

export const KIND_CONFIGS = { bodies, lenses, 'extension-sets': extensionSets, rails } as const;
export const FORMAT_OPTIONS = [...SENSOR_PRESETS.map((p) => ({ value: p.format, label: p.label })), { value: 'custom', label: 'Custom size' }];
