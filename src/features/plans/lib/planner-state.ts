// The planner form: strings as typed, turned into a PlanInput with the shared schema, and each
// problem mapped back to the field that shows it, in that field's own unit.
import type { z } from 'zod';
import { cocForSensor } from '@shared/optics';
import { planInputSchema, sensorSchema, type DofModel, type PlanInput } from '@shared/schemas/plan-input';
import type { FocusingMethod, PlanKit } from '@shared/schemas/plan';
import type { Body, ExtensionSet, Lens, Rail } from '@shared/schemas/kit';
import { sig } from '@/lib/units';

export type CocRule = 'format' | 'pixel' | 'custom';

export interface PlannerState {
  bodyId: string;
  lensId: string;
  extensionSetId: string;
  tubeIndexes: number[];
  railId: string;
  sensorWidthMm: string;
  sensorHeightMm: string;
  pixelsAcross: string;
  focalLengthMm: string;
  pupilMagnification: string;
  baseMagnification: string;
  extensionMm: string;
  fNumber: string;
  cocRule: CocRule;
  cocUm: string;
  dofModel: DofModel;
  depthMm: string;
  overlapPct: string;
  focusingMethod: FocusingMethod;
  railStepUm: string;
  secondsPerFrame: string;
  exposureTime: string;
  stableMin: string;
}

export type TextKey = { [K in keyof PlannerState]: PlannerState[K] extends string ? K : never }[keyof PlannerState];
export type FieldErrors = Partial<Record<keyof PlannerState, string>>;

export const DEFAULT_PLANNER_STATE: PlannerState = {
  bodyId: '', lensId: '', extensionSetId: '', tubeIndexes: [], railId: '',
  sensorWidthMm: '36', sensorHeightMm: '24', pixelsAcross: '6000',
  focalLengthMm: '50', pupilMagnification: '1', baseMagnification: '0', extensionMm: '25',
  fNumber: '8', cocRule: 'format', cocUm: '', dofModel: 'geometric',
  depthMm: '4', overlapPct: '20', focusingMethod: 'rail', railStepUm: '5',
  secondsPerFrame: '2', exposureTime: '1/125', stableMin: '10',
};

// Where each PlanInput path is shown, and how its number is scaled and labelled there.
const FIELDS: Record<string, { key: TextKey; scale: number; unit: string; prefix?: string }> = {
  focalLengthMm: { key: 'focalLengthMm', scale: 1, unit: ' mm' },
  extensionMm: { key: 'extensionMm', scale: 1, unit: ' mm' },
  baseMagnification: { key: 'baseMagnification', scale: 1, unit: '×' },
  pupilMagnification: { key: 'pupilMagnification', scale: 1, unit: '' },
  fNumber: { key: 'fNumber', scale: 1, unit: '', prefix: 'f/' },
  cocMm: { key: 'cocUm', scale: 1000, unit: ' µm' },
  'sensor.widthMm': { key: 'sensorWidthMm', scale: 1, unit: ' mm' },
  'sensor.heightMm': { key: 'sensorHeightMm', scale: 1, unit: ' mm' },
  'sensor.pixelsAcross': { key: 'pixelsAcross', scale: 1, unit: ' px' },
  depthMm: { key: 'depthMm', scale: 1, unit: ' mm' },
  overlap: { key: 'overlapPct', scale: 100, unit: ' %' },
  railStepUm: { key: 'railStepUm', scale: 1, unit: ' µm' },
  secondsPerFrame: { key: 'secondsPerFrame', scale: 1, unit: ' s' },
  stableSeconds: { key: 'stableMin', scale: 1 / 60, unit: ' min' },
  exposureTimeS: { key: 'exposureTime', scale: 1, unit: ' s' },
};

/** The form field that shows an API or schema path (`inputs.` prefix allowed). */
export function fieldForPath(path: string): keyof PlannerState | undefined {
  const p = path.replace(/^inputs\./, '');
  if (p === 'dofModel') return 'dofModel';
  if (p.startsWith('kit.')) return ({ 'kit.bodyId': 'bodyId', 'kit.lensId': 'lensId', 'kit.extensionSetId': 'extensionSetId', 'kit.railId': 'railId', 'kit.tubeIndexes': 'tubeIndexes' } as const)[p];
  return FIELDS[p]?.key;
}

/** '' → undefined; a decimal comma is accepted; 'a/b' too when fractions are allowed (1/125 s). */
export function parseNumber(s: string, fractions = false): number | undefined {
  const t = s.trim().replace(/\s*s$/, '').replace(',', '.');
  if (t === '') return undefined;
  const frac = fractions ? /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(t) : null;
  if (frac) return Number(frac[1]) / Number(frac[2]);
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : NaN;
}

function humanise(issue: z.core.$ZodIssue, path: string): string {
  const f = FIELDS[path];
  const show = (n: unknown) => `${f?.prefix ?? ''}${sig(Number(n) * (f?.scale ?? 1), 4)}${f?.unit ?? ''}`;
  if (issue.code === 'too_small') return `${issue.inclusive === false ? 'More than' : 'At least'} ${show(issue.minimum)}.`;
  if (issue.code === 'too_big') return `${issue.inclusive === false ? 'Less than' : 'At most'} ${show(issue.maximum)}.`;
  if (issue.code === 'invalid_type') return (issue as { expected?: string }).expected === 'int' ? 'Use a whole number.' : 'Enter a number.';
  if (path === 'secondsPerFrame') return 'At least the exposure time: the cycle per frame includes the exposure.';
  return issue.message;
}

export interface Derived {
  input: PlanInput | null;
  errors: FieldErrors;
  cocMm: number | null;
}

/** Turns the form into a PlanInput, or says per field what is wrong. */
export function derive(s: PlannerState, lens?: Lens): Derived {
  const errors: FieldErrors = {};
  const num = (key: TextKey, required: boolean, fractions = false) => {
    const v = parseNumber(s[key], fractions);
    if (v === undefined && required) errors[key] = 'Enter a number.';
    else if (Number.isNaN(v)) errors[key] = fractions ? 'Enter a number, or a fraction such as 1/125.' : 'Enter a number.';
    return v;
  };
  const sensor = { widthMm: num('sensorWidthMm', true), heightMm: num('sensorHeightMm', true), pixelsAcross: num('pixelsAcross', true) };
  const sensorOk = sensorSchema.safeParse(sensor);
  let cocMm: number | undefined;
  if (s.cocRule === 'custom') {
    const um = num('cocUm', true);
    cocMm = um === undefined ? undefined : um / 1000;
  } else if (sensorOk.success) {
    cocMm = cocForSensor(sensorOk.data, s.cocRule);
  }
  const stableMin = num('stableMin', false);
  const overlapPct = num('overlapPct', true);
  const railStepUm = s.focusingMethod === 'rail' ? num('railStepUm', true) : undefined;
  if (s.focusingMethod === 'rail' && s.railStepUm.trim() === '') errors.railStepUm = 'Pick a rail, or enter its smallest step.';
  const candidate = {
    focalLengthMm: num('focalLengthMm', true),
    extensionMm: num('extensionMm', true),
    baseMagnification: num('baseMagnification', false),
    pupilMagnification: num('pupilMagnification', false),
    fNumber: num('fNumber', true),
    cocMm: cocMm ?? 0.03,
    sensor,
    depthMm: num('depthMm', true),
    overlap: overlapPct === undefined ? undefined : overlapPct / 100,
    dofModel: s.dofModel,
    railStepUm,
    secondsPerFrame: num('secondsPerFrame', false),
    stableSeconds: stableMin === undefined ? undefined : stableMin * 60,
    exposureTimeS: num('exposureTime', false, true),
  };
  const parsed = planInputSchema.safeParse(candidate);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = issue.path.join('.');
      const key = fieldForPath(path);
      if (key && !errors[key]) errors[key] = humanise(issue, path);
    }
  }
  const base = candidate.baseMagnification ?? 0;
  if (lens && base > lens.maxMagnification + 1e-9 && !errors.baseMagnification) {
    errors.baseMagnification = `This lens reaches at most ${sig(lens.maxMagnification)}× on its own; add extension for more.`;
  }
  const ok = parsed.success && Object.keys(errors).length === 0;
  return { input: ok ? parsed.data : null, errors, cocMm: cocMm ?? null };
}

const text = (n: number | undefined, fallback = '') => (n === undefined ? fallback : String(Number(n.toPrecision(12))));

/** A saved plan back into the form (its CoC shown as the rule it matches, else as a custom value). */
export function stateFromPlan(inputs: PlanInput, kit: PlanKit, focusingMethod: FocusingMethod): PlannerState {
  const rule = (['format', 'pixel'] as const).find((r) => Math.abs(cocForSensor(inputs.sensor, r) - inputs.cocMm) < 1e-9);
  const exposureS = inputs.exposureTimeS;
  return {
    bodyId: kit.bodyId ?? '', lensId: kit.lensId ?? '', extensionSetId: kit.extensionSetId ?? '', tubeIndexes: kit.tubeIndexes, railId: kit.railId ?? '',
    sensorWidthMm: text(inputs.sensor.widthMm), sensorHeightMm: text(inputs.sensor.heightMm), pixelsAcross: text(inputs.sensor.pixelsAcross),
    focalLengthMm: text(inputs.focalLengthMm), pupilMagnification: text(inputs.pupilMagnification, '1'),
    baseMagnification: text(inputs.baseMagnification, '0'), extensionMm: text(inputs.extensionMm),
    fNumber: text(inputs.fNumber), cocRule: rule ?? 'custom', cocUm: text(inputs.cocMm * 1000),
    dofModel: inputs.dofModel, depthMm: text(inputs.depthMm), overlapPct: text(inputs.overlap * 100),
    focusingMethod, railStepUm: text(inputs.railStepUm, DEFAULT_PLANNER_STATE.railStepUm),
    secondsPerFrame: text(inputs.secondsPerFrame),
    exposureTime: exposureS !== undefined && exposureS < 0.5 && Number.isInteger(Number((1 / exposureS).toPrecision(12))) ? `1/${Number((1 / exposureS).toPrecision(12))}` : text(exposureS),
    stableMin: inputs.stableSeconds === undefined ? '' : text(inputs.stableSeconds / 60),
  };
}

export function kitOf(s: PlannerState): PlanKit {
  return {
    bodyId: s.bodyId || null,
    lensId: s.lensId || null,
    extensionSetId: s.extensionSetId || null,
    tubeIndexes: s.extensionSetId ? s.tubeIndexes : [],
    railId: s.focusingMethod === 'rail' ? s.railId || null : null,
  };
}

// Picking kit copies its values into the fields; typing over them afterwards unlinks the kit item.
const LINKED: Partial<Record<TextKey, Partial<PlannerState>>> = {
  sensorWidthMm: { bodyId: '' }, sensorHeightMm: { bodyId: '' }, pixelsAcross: { bodyId: '' },
  focalLengthMm: { lensId: '' }, pupilMagnification: { lensId: '' },
  extensionMm: { tubeIndexes: [] }, railStepUm: { railId: '' },
};

export function editField(s: PlannerState, key: TextKey, value: string): PlannerState {
  return { ...s, ...LINKED[key], [key]: value };
}

export function pickBody(s: PlannerState, b: Body | undefined): PlannerState {
  if (!b) return { ...s, bodyId: '' };
  return { ...s, bodyId: b.id, sensorWidthMm: String(b.sensorWidthMm), sensorHeightMm: String(b.sensorHeightMm), pixelsAcross: String(b.pixelsAcross) };
}

export function pickLens(s: PlannerState, l: Lens | undefined): PlannerState {
  if (!l) return { ...s, lensId: '' };
  const base = parseNumber(s.baseMagnification) ?? 0;
  return {
    ...s, lensId: l.id, focalLengthMm: String(l.focalLengthMm), pupilMagnification: String(l.pupilMagnification),
    baseMagnification: base > l.maxMagnification ? String(l.maxMagnification) : s.baseMagnification,
  };
}

const tubeSum = (set: ExtensionSet, indexes: number[]) => indexes.reduce((a, i) => a + (set.tubeLengthsMm[i] ?? 0), 0);

export function pickExtensionSet(s: PlannerState, set: ExtensionSet | undefined): PlannerState {
  const hadTubes = s.tubeIndexes.length > 0;
  return { ...s, extensionSetId: set?.id ?? '', tubeIndexes: [], extensionMm: hadTubes ? '0' : s.extensionMm };
}

export function toggleTube(s: PlannerState, set: ExtensionSet, index: number): PlannerState {
  const tubeIndexes = s.tubeIndexes.includes(index) ? s.tubeIndexes.filter((i) => i !== index) : [...s.tubeIndexes, index].sort((a, b) => a - b);
  return { ...s, tubeIndexes, extensionMm: String(Number(tubeSum(set, tubeIndexes).toPrecision(12))) };
}

export function pickRail(s: PlannerState, r: Rail | undefined): PlannerState {
  if (!r) return { ...s, railId: '' };
  return { ...s, railId: r.id, railStepUm: String(r.smallestStepUm) };
}
