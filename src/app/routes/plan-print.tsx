import { Link, useParams } from 'react-router';
import { QueryState } from '@/components/query-state';
import { Button } from '@/components/button';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { usePlan } from '@/features/plans/api/get-plan';
import { StepTable } from '@/features/plans/components/step-table';
import { count, duration, exposure, fNumber, length, magnification, sig } from '@/lib/units';
import { paths } from '../paths';

// Printed pages: small margins, nothing but the plan (the shell's header is marked no-print).
const PRINT_CSS = '@page { size: auto; margin: 10mm; } @media print { main { padding: 0 !important; max-width: none !important; } }';

export function Component() {
  const { planId = '' } = useParams();
  const { studioId } = useActiveStudio();
  const plan = usePlan(studioId, planId);
  const p = plan.data;
  return (
    <QueryState isPending={plan.isPending} error={plan.error} label="plan">
      {p ? (
        <article className="text-ink print:text-[9pt]">
          <style>{PRINT_CSS}</style>
          <div className="no-print mb-4 flex flex-wrap gap-2">
            <Button onClick={() => window.print()}>Print</Button>
            <Link to={paths.plan(p.id)} className="inline-flex items-center px-3 py-1.5 text-sm text-moss hover:underline">Back to the plan</Link>
          </div>
          <h1 className="text-xl font-semibold print:text-[13pt]">{p.name}</h1>
          <p className="num mt-1 text-sm print:text-[9pt]">
            {magnification(p.result.magnification)} · {fNumber(p.inputs.fNumber)} (working {fNumber(p.result.workingFNumber, 3)}) ·
            {' '}{sig(p.inputs.depthMm)} mm deep in <strong>{count(p.result.frames)} frames</strong>
            {p.result.stepMm !== null ? <> · step {length(p.result.stepMm)}</> : null}
            {p.inputs.railStepUm !== undefined && p.result.stepMm !== null
              ? <> = {count(Math.round((p.result.stepMm * 1000) / p.inputs.railStepUm))} rail steps of {sig(p.inputs.railStepUm)} µm</>
              : <> · moving the camera</>}
          </p>
          <p className="num mb-3 text-sm text-slate print:text-[8pt]">
            Sensor {sig(p.inputs.sensor.widthMm)} × {sig(p.inputs.sensor.heightMm)} mm · focal length {sig(p.inputs.focalLengthMm)} mm · extension {sig(p.inputs.extensionMm)} mm
            {p.inputs.exposureTimeS !== undefined ? <> · exposure {exposure(p.inputs.exposureTimeS)}</> : null}
            {p.result.shootSeconds !== null ? <> · shoot time {duration(p.result.shootSeconds)}</> : null}
            {' '}· positions from the near limit
          </p>
          <StepTable plan={p.result} />
          {p.result.positionsTruncated ? <p className="mt-2 text-sm text-clay">Positions are listed for the first {count(p.result.positionsMm.length)} of {count(p.result.frames)} frames.</p> : null}
        </article>
      ) : null}
    </QueryState>
  );
}
