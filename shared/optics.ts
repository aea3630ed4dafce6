import { z } from 'zod';
import {
  fNumberListSchema,
  planInputSchema,
  sensorSchema,
  type ApertureSweep,
  type ApertureSweepRow,
  type PlanInput,
  type PlanWarning,
  type PlanWarningCode,
  type Sensor,
  type StackPlan,
} from './schemas/plan-input';

/** The ⅓-stop f-number series the planner sweeps. */
export const THIRD_STOP_SERIES = [
  2.8, 3.2, 3.5, 4, 4.5, 5, 5.6, 6.3, 7.1, 8, 9, 10, 11, 13, 14, 16, 18, 20, 22,
] as const;

export const DEFAULT_WAVELENGTH_UM = 0.55;
/** Diffraction softening becomes visible once the Airy disk spans 2–3 pixels (common practice). */
export const SOFT_AIRY_PIXELS = 2.5;
export const MANY_FRAMES = 2000;
export const MAX_LISTED_POSITIONS = 2000;
/** Exposures in this band blur most from shutter and floor vibration at ≥ 1× (common practice). */
export const VIBRATION_EXPOSURE_S = { min: 1 / 15, max: 2 } as const;
export const VIBRATION_MIN_MAGNIFICATION = 1;

// Relative tolerance so 1.1 / 0.1 = 11.000000000000002 counts as 11 whole steps, not 12.
const EPS = 1e-9;

/** Thin-lens equation (Wikipedia, "Thin lens"): extension e beyond the focus setting adds e / f. */
export function magnificationOf(focalLengthMm: number, extensionMm: number, baseMagnification = 0): number {
  return baseMagnification + extensionMm / focalLengthMm;
}

/** Wikipedia, "F-number" (working f-number): N_w = N · (1 + m / P). */
export function workingFNumberOf(fNumber: number, magnification: number, pupilMagnification = 1): number {
  return fNumber * (1 + magnification / pupilMagnification);
}

/** Exposure scales with N_w² (Wikipedia, "F-number"), so the loss is 2 · log₂(1 + m / P) stops. */
export function lightLossStopsOf(magnification: number, pupilMagnification = 1): number {
  return 2 * Math.log2(1 + magnification / pupilMagnification);
}

/**
 * Wikipedia, "Depth of field" (close-up, in terms of magnification):
 * DOF = 2·N·c·(1 + m/P) / (m² − (N·c/f)²); Infinity where the denominator ≤ 0 (at or beyond the
 * hyperfocal distance).
 */
export function geometricDofMm(
  fNumber: number,
  cocMm: number,
  magnification: number,
  focalLengthMm: number,
  pupilMagnification = 1,
): number {
  const denominator = magnification ** 2 - ((fNumber * cocMm) / focalLengthMm) ** 2;
  if (denominator <= 0) return Infinity;
  return (2 * fNumber * cocMm * (1 + magnification / pupilMagnification)) / denominator;
}

/**
 * MicroscopyU, "Depth of Field and Depth of Focus": d = λ·n / NA² + n·e / (M·NA), with n = 1 (air),
 * e = the circle of confusion at the sensor, NA the subject-side numerical aperture. λ in µm → mm.
 */
export function waveDofMm(wavelengthUm: number, numericalAperture: number, cocMm: number, magnification: number): number {
  if (magnification <= 0 || numericalAperture <= 0) return Infinity;
  const wavelengthMm = wavelengthUm / 1000;
  return wavelengthMm / numericalAperture ** 2 + cocMm / (magnification * numericalAperture);
}

/** Wikipedia, "Airy disk": diameter to the first dark ring = 2.44 · λ · N (N the working f-number). */
export function airyDiskUmOf(wavelengthUm: number, workingFNumber: number): number {
  return 2.44 * wavelengthUm * workingFNumber;
}

/** n = ⌈depth / step⌉ + 1 positions, 0, step, 2·step … from the near limit. */
export function framesFor(depthMm: number, stepMm: number): number {
  return Math.ceil((depthMm / stepMm) * (1 - EPS)) + 1;
}

/** Circle of confusion: format (diagonal / 1500) or pixel level (2 × pixel pitch). */
export function cocForSensor(sensor: Sensor, rule: 'format' | 'pixel'): number {
  const s = sensorSchema.parse(sensor);
  const r = z.enum(['format', 'pixel']).parse(rule);
  return r === 'format' ? Math.hypot(s.widthMm, s.heightMm) / 1500 : (2 * s.widthMm) / s.pixelsAcross;
}

const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);
const fmt = (x: number): string => String(Number(x.toPrecision(3)));
const fmtDuration = (s: number): string => (s < 120 ? `${fmt(s)} s` : `${fmt(s / 60)} min`);

/** Marked and working f-number; an objective's NA sets N_w = m / (2·NA) (subject-side NA). */
function apertureOf(p: PlanInput, m: number, pupil: number): { marked: number; working: number } {
  if (p.numericalAperture === undefined || m === 0) {
    return { marked: p.fNumber, working: workingFNumberOf(p.fNumber, m, pupil) };
  }
  const working = m / (2 * p.numericalAperture);
  return { marked: working / (1 + m / pupil), working };
}

/** Step rounded down to whole rail steps (at least one). */
function railSpacing(stepMm: number, railStepUm: number): { stepsPerFrame: number; stepMm: number } {
  const stepsPerFrame = Math.max(1, Math.floor(((stepMm * 1000) / railStepUm) * (1 + EPS)));
  return { stepsPerFrame, stepMm: (stepsPerFrame * railStepUm) / 1000 };
}

/** Computes a focus-stack plan. Throws the ZodError (issues name the field path) on bad input. */
export function planStack(input: PlanInput): StackPlan {
  const p = planInputSchema.parse(input);
  const pupil = p.pupilMagnification ?? 1;
  const wavelengthUm = p.wavelengthUm ?? DEFAULT_WAVELENGTH_UM;
  const m = magnificationOf(p.focalLengthMm, p.extensionMm, p.baseMagnification ?? 0);
  const { marked, working } = apertureOf(p, m, pupil);
  const warnings: PlanWarning[] = [];
  const warn = (code: PlanWarningCode, message: string) => warnings.push({ code, message });

  const dofMm =
    m === 0
      ? Infinity
      : p.dofModel === 'wave'
        ? waveDofMm(wavelengthUm, m / (2 * working), p.cocMm, m)
        : geometricDofMm(marked, p.cocMm, m, p.focalLengthMm, pupil);

  let stepMm: number | null = null;
  let frames = 1;
  let positionsMm = [0];
  let railSteps: number[] | null = p.railStepUm === undefined ? null : [0];
  if (m === 0) {
    warn('no-magnification', 'At infinity with no extension there is no close-up magnification, so one frame covers the whole depth. Add extension or focus closer to plan a stack.');
  } else if (!Number.isFinite(dofMm)) {
    warn('dof-unbounded', 'Focused at or beyond the hyperfocal distance: one frame is sharp to infinity, so no stack is needed.');
  } else {
    stepMm = dofMm * (1 - p.overlap);
    let stepsPerFrame: number | null = null;
    if (p.railStepUm !== undefined) {
      const railStepMm = p.railStepUm / 1000;
      ({ stepsPerFrame, stepMm } = railSpacing(stepMm, p.railStepUm));
      if (dofMm < railStepMm * (1 - EPS)) {
        warn('rail-too-coarse', `One frame is only ${fmt(dofMm * 1000)} µm deep but the rail's smallest step is ${fmt(p.railStepUm)} µm, so even one rail step at a time leaves unsharp gaps between frames. Use a finer rail or stop down.`);
      } else if (dofMm * (1 - p.overlap) < railStepMm * (1 - EPS)) {
        warn('overlap-reduced', `The rail's smallest step (${fmt(p.railStepUm)} µm) is larger than the planned step, so frames overlap less than asked.`);
      }
    }
    frames = framesFor(p.depthMm, stepMm);
    const listed = Math.min(frames, MAX_LISTED_POSITIONS);
    const step = stepMm;
    positionsMm = Array.from({ length: listed }, (_, i) =>
      stepsPerFrame === null ? i * step : (i * stepsPerFrame * (p.railStepUm as number)) / 1000,
    );
    if (stepsPerFrame !== null) railSteps = Array.from({ length: listed }, (_, i) => i * (stepsPerFrame as number));
    if (frames > MANY_FRAMES) {
      warn('too-many-frames', `The stack needs ${frames} frames (positions listed for the first ${listed}). Stop down, lower the magnification, or shoot less depth.`);
    }
  }

  const airyDiskUm = airyDiskUmOf(wavelengthUm, working);
  const pixelPitchUm = (p.sensor.widthMm / p.sensor.pixelsAcross) * 1000;
  const airyPx = airyDiskUm / pixelPitchUm;
  if (airyPx > SOFT_AIRY_PIXELS) {
    const sharpLimit = (SOFT_AIRY_PIXELS * pixelPitchUm) / airyDiskUmOf(wavelengthUm, 1 + m / pupil);
    const sharpStop = [...THIRD_STOP_SERIES].reverse().find((n) => n <= sharpLimit) ?? sharpLimit;
    const advice = p.numericalAperture === undefined ? `open up to f/${fmt(sharpStop)} or wider` : 'use a lower magnification or a sensor with larger pixels';
    warn('diffraction-soft', `The Airy disk (${fmt(airyDiskUm)} µm) spans ${fmt(airyPx)} pixels; beyond about ${SOFT_AIRY_PIXELS} pixels diffraction visibly softens fine detail. To keep it crisp, ${advice}.`);
  }

  const shootSeconds = p.secondsPerFrame === undefined ? null : frames * p.secondsPerFrame;
  if (shootSeconds !== null && p.stableSeconds !== undefined && shootSeconds > p.stableSeconds) {
    warn('over-time', `Shooting ${frames} frames takes about ${fmtDuration(shootSeconds)}, longer than the subject stays unchanged (${fmtDuration(p.stableSeconds)}). Use fewer frames (stop down or less overlap), a shorter cycle per frame, or split the depth into parts.`);
  }
  const t = p.exposureTimeS;
  if (t !== undefined && m >= VIBRATION_MIN_MAGNIFICATION && t >= VIBRATION_EXPOSURE_S.min * (1 - EPS) && t <= VIBRATION_EXPOSURE_S.max) {
    warn('vibration-risk', `At ${fmt(m)}× an exposure of ${fmt(t)} s picks up shutter and floor vibration. Use flash, a settle delay, or a much shorter or longer exposure.`);
  }

  return {
    magnification: m,
    workingFNumber: working,
    lightLossStops: lightLossStopsOf(m, pupil),
    frameDofMm: finiteOrNull(dofMm),
    stepMm,
    frames,
    positionsMm,
    positionsTruncated: frames > positionsMm.length,
    railSteps,
    airyDiskUm,
    pixelPitchUm,
    fieldWidthMm: m === 0 ? null : p.sensor.widthMm / m,
    fieldHeightMm: m === 0 ? null : p.sensor.heightMm / m,
    shootSeconds,
    warnings,
  };
}

/**
 * Plans the stack at each f-number (default: the ⅓-stop series) and recommends the largest one
 * whose Airy disk stays within SOFT_AIRY_PIXELS (fewest frames without visible softening).
 * A microscope objective's fixed NA is set aside here: the sweep is for lenses with an iris.
 */
export function apertureSweep(input: PlanInput, fNumbers: readonly number[] = THIRD_STOP_SERIES): ApertureSweep {
  const base = planInputSchema.parse(input);
  const list = z.object({ fNumbers: fNumberListSchema }).parse({ fNumbers: [...fNumbers] }).fNumbers;
  const warnings: PlanWarning[] = [];
  if (base.numericalAperture !== undefined) {
    warnings.push({ code: 'fixed-aperture', message: 'The objective’s numerical aperture is fixed; this sweep shows a lens with an adjustable aperture instead.' });
  }

  const rows: ApertureSweepRow[] = list.map((fNumber) => {
    const { positionsMm: _p, railSteps: _r, ...figures } = planStack({ ...base, fNumber, numericalAperture: undefined });
    const airyDiskPx = figures.airyDiskUm / figures.pixelPitchUm;
    const overTime = figures.shootSeconds !== null && base.stableSeconds !== undefined && figures.shootSeconds > base.stableSeconds;
    return { fNumber, ...figures, airyDiskPx, diffractionSoft: airyDiskPx > SOFT_AIRY_PIXELS, overTime };
  });

  const sharp = rows.filter((r) => !r.diffractionSoft);
  let recommended: ApertureSweepRow;
  if (sharp.length > 0) {
    recommended = sharp.reduce((a, b) => (b.fNumber > a.fNumber ? b : a));
  } else {
    recommended = rows.reduce((a, b) => (b.fNumber < a.fNumber ? b : a));
    warnings.push({ code: 'all-diffraction-soft', message: `Every aperture in the sweep softens detail through diffraction at ${fmt(recommended.magnification)}×; f/${fmt(recommended.fNumber)}, the widest, softens least.` });
  }
  if (recommended.overTime && recommended.shootSeconds !== null) {
    warnings.push({ code: 'over-time', message: `Even at f/${fmt(recommended.fNumber)} the ${recommended.frames} frames take about ${fmtDuration(recommended.shootSeconds)}, longer than the subject stays unchanged. Shorten the cycle per frame, use less overlap, or split the depth.` });
  }
  return { rows, recommendedFNumber: recommended.fNumber, warnings };
}
