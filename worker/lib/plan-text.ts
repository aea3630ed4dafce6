// The linked plan as plain text for a bundle's plan.txt: what a retoucher or the photographer
// reads beside the frames (inputs, the computed figures and the focus positions).
import type { PlanInput, StackPlan } from '@shared/schemas/plan-input';

export interface PlanForText {
  name: string;
  notes: string;
  focusingMethod: string;
  inputs: PlanInput;
  result: StackPlan;
}

const num = (x: number, digits = 4) => (Number.isFinite(x) ? String(Number(x.toPrecision(digits))) : '–');
const mm = (x: number | null) => (x === null ? 'unbounded' : x < 1 ? `${num(x * 1000)} µm` : `${num(x)} mm`);

function seconds(s: number | null): string {
  if (s === null) return '–';
  return s < 120 ? `${num(s, 3)} s` : `${num(s / 60, 3)} min`;
}

/** One line per figure, units beside every number; positions one per line from the near limit. */
export function planText(plan: PlanForText, stackFrameCount?: number): string {
  const { inputs: i, result: r } = plan;
  const lines = [
    `Plan: ${plan.name}`,
    '',
    'Inputs',
    `  focal length          ${num(i.focalLengthMm)} mm`,
    `  extension             ${num(i.extensionMm)} mm`,
    ...(i.baseMagnification ? [`  lens magnification    ${num(i.baseMagnification)}×`] : []),
    `  pupil magnification   ${num(i.pupilMagnification ?? 1)}`,
    `  marked f-number       f/${num(i.fNumber, 3)}`,
    ...(i.numericalAperture ? [`  numerical aperture    ${num(i.numericalAperture)}`] : []),
    `  circle of confusion   ${num(i.cocMm * 1000)} µm`,
    `  sensor                ${num(i.sensor.widthMm)} × ${num(i.sensor.heightMm)} mm, ${i.sensor.pixelsAcross} px across`,
    `  subject depth         ${mm(i.depthMm)}`,
    `  overlap               ${num(i.overlap * 100, 3)} %`,
    `  depth of field model  ${i.dofModel}`,
    `  focusing              ${plan.focusingMethod}${i.railStepUm ? `, rail step ${num(i.railStepUm)} µm` : ''}`,
    ...(i.secondsPerFrame !== undefined ? [`  time per frame        ${seconds(i.secondsPerFrame)}`] : []),
    '',
    'Results',
    `  magnification         ${num(r.magnification)}×`,
    `  working f-number      f/${num(r.workingFNumber, 3)}`,
    `  light loss            ${num(r.lightLossStops, 3)} stops`,
    `  frame depth of field  ${mm(r.frameDofMm)}`,
    `  step                  ${mm(r.stepMm)}`,
    `  frames                ${r.frames}${stackFrameCount !== undefined ? ` (this stack holds ${stackFrameCount})` : ''}`,
    `  Airy disk             ${num(r.airyDiskUm, 3)} µm (pixel pitch ${num(r.pixelPitchUm, 3)} µm)`,
    `  field of view         ${r.fieldWidthMm === null || r.fieldHeightMm === null ? '–' : `${num(r.fieldWidthMm)} × ${num(r.fieldHeightMm)} mm`}`,
    `  shoot time            ${seconds(r.shootSeconds)}`,
  ];
  if (r.warnings.length) lines.push('', 'Cautions', ...r.warnings.map((w) => `  - ${w.message}`));
  lines.push('', `Focus positions from the near limit (mm)${r.positionsTruncated ? `, the first ${r.positionsMm.length} of ${r.frames}` : ''}`);
  r.positionsMm.forEach((p, index) => {
    const steps = r.railSteps?.[index];
    lines.push(`  ${String(index + 1).padStart(4)}  ${p.toFixed(4)}${steps !== undefined ? `  (${steps} rail steps)` : ''}`);
  });
  if (plan.notes.trim()) lines.push('', 'Notes', ...plan.notes.trim().split(/\r?\n/).map((l) => `  ${l}`));
  return `${lines.join('\n')}\n`;
}
