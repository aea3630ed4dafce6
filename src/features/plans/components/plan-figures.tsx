import type { StackPlan } from '@shared/schemas/plan-input';
import { count, duration, fNumber, length, magnification, sig } from '@/lib/units';

interface Props {
  plan: StackPlan;
  railStepUm?: number;
  stableSeconds?: number;
}

/** The computed figures of one plan, each with its unit. */
export function PlanFigures({ plan, railStepUm, stableSeconds }: Props) {
  const airyPx = plan.airyDiskUm / plan.pixelPitchUm;
  const stepsPerFrame = railStepUm && plan.stepMm !== null ? Math.round((plan.stepMm * 1000) / railStepUm) : null;
  const overTime = plan.shootSeconds !== null && stableSeconds !== undefined && plan.shootSeconds > stableSeconds;
  const figures: { label: string; value: string; detail?: string; alert?: boolean }[] = [
    { label: 'Magnification', value: magnification(plan.magnification) },
    { label: 'Working f-number', value: fNumber(plan.workingFNumber, 3) },
    { label: 'Light loss', value: `${sig(plan.lightLossStops)} stops` },
    { label: 'Frame depth of field', value: length(plan.frameDofMm) },
    {
      label: 'Step',
      value: plan.stepMm === null ? '—' : length(plan.stepMm),
      detail: stepsPerFrame === null ? undefined : `${count(stepsPerFrame)} rail steps of ${sig(railStepUm as number)} µm`,
    },
    { label: 'Frames', value: count(plan.frames), detail: plan.positionsTruncated ? `positions listed for the first ${count(plan.positionsMm.length)}` : undefined },
    {
      label: 'Field of view',
      value: plan.fieldWidthMm === null || plan.fieldHeightMm === null ? '—' : `${sig(plan.fieldWidthMm)} × ${sig(plan.fieldHeightMm)} mm`,
    },
    {
      label: 'Airy disk',
      value: `${sig(plan.airyDiskUm)} µm · ${sig(airyPx)} px`,
      detail: `pixel pitch ${sig(plan.pixelPitchUm)} µm`,
      alert: airyPx > 2.5,
    },
    {
      label: 'Shoot time',
      value: duration(plan.shootSeconds),
      detail: stableSeconds === undefined ? 'subject stable time not set' : `subject still for ${duration(stableSeconds)}`,
      alert: overTime,
    },
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-3">
      {figures.map((f) => (
        <div key={f.label} className={`min-w-0 rounded border px-3 py-2 ${f.alert ? 'border-clay/50 bg-clay/5' : 'border-rule bg-card'}`}>
          <dt className="text-xs text-slate">{f.label}</dt>
          <dd className={`num text-lg font-semibold ${f.alert ? 'text-clay' : 'text-ink'}`}>{f.value}</dd>
          {f.detail ? <dd className="num text-xs text-slate">{f.detail}</dd> : null}
        </div>
      ))}
    </dl>
  );
}
