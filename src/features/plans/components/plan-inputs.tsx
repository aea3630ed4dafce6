import type { Kit } from '@shared/schemas/kit';
import type { PlanView } from '@shared/schemas/plan';
import { duration, exposure, fNumber, sig } from '@/lib/units';

const named = (list: { id: string; name: string }[], id: string | null) =>
  id === null ? 'typed values' : (list.find((x) => x.id === id)?.name ?? 'no longer in the kit');

/** What the plan was computed from, with the kit it names. */
export function PlanInputs({ plan, kit }: { plan: PlanView; kit: Kit | undefined }) {
  const p = plan.inputs;
  const k = plan.kit;
  const set = kit?.extensionSets.find((s) => s.id === k.extensionSetId);
  const tubes = set && k.tubeIndexes.length ? ` (${k.tubeIndexes.map((i) => `${sig(set.tubeLengthsMm[i] ?? 0)} mm`).join(' + ')})` : '';
  const rows: [string, string][] = [
    ['Body', kit ? named(kit.bodies, k.bodyId) : '…'],
    ['Sensor', `${sig(p.sensor.widthMm)} × ${sig(p.sensor.heightMm)} mm, ${p.sensor.pixelsAcross} px across`],
    ['Lens', kit ? named(kit.lenses, k.lensId) : '…'],
    ['Focal length', `${sig(p.focalLengthMm)} mm`],
    ['Lens’s own magnification', `${sig(p.baseMagnification ?? 0)}×`],
    ['Extension', `${sig(p.extensionMm)} mm${k.extensionSetId && kit ? ` — ${named(kit.extensionSets, k.extensionSetId)}${tubes}` : ''}`],
    ['Pupil magnification', `${sig(p.pupilMagnification ?? 1)}×`],
    ['Aperture', fNumber(p.fNumber)],
    ['Circle of confusion', `${sig(p.cocMm * 1000)} µm`],
    ['Depth-of-field model', p.dofModel === 'wave' ? 'Wave optics' : 'Geometric'],
    ['Depth to cover', `${sig(p.depthMm)} mm`],
    ['Overlap', `${sig(p.overlap * 100)} %`],
    ['Focusing', plan.focusingMethod === 'rail' ? `Rail${kit && k.railId ? ` — ${named(kit.rails, k.railId)}` : ''}, ${sig(p.railStepUm ?? 0)} µm smallest step` : 'Moving the camera'],
    ['Seconds per frame', p.secondsPerFrame === undefined ? 'not set' : `${sig(p.secondsPerFrame)} s`],
    ['Exposure time', p.exposureTimeS === undefined ? 'not set' : exposure(p.exposureTimeS)],
    ['Subject stays still for', p.stableSeconds === undefined ? 'not set' : duration(p.stableSeconds)],
  ];
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-2 lg:grid-cols-1">
      {rows.map(([label, value]) => (
        <div key={label} className="flex min-w-0 justify-between gap-3 border-b border-rule/60 py-1">
          <dt className="text-slate">{label}</dt>
          <dd className="num text-right text-ink">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
