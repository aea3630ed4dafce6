import { Link, useNavigate, useParams } from 'react-router';
import { PageHeader, QueryState, ErrorNote } from '@/components/query-state';
import { Button } from '@/components/button';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useKit } from '@/features/kit/api/get-kit';
import { usePlan } from '@/features/plans/api/get-plan';
import { useDuplicatePlan } from '@/features/plans/api/duplicate-plan';
import { useDeletePlan } from '@/features/plans/api/delete-plan';
import { PlanInputs } from '@/features/plans/components/plan-inputs';
import { PlanFigures } from '@/features/plans/components/plan-figures';
import { PlanCautions } from '@/features/plans/components/plan-cautions';
import { SweepChart, SweepTable } from '@/features/plans/components/sweep-chart';
import { DepthChart } from '@/features/plans/components/depth-chart';
import { paths } from '../paths';

const linkButton = 'inline-flex items-center rounded border border-rule bg-card px-3 py-1.5 text-sm font-medium text-ink hover:border-slate';

export function Component() {
  const { planId = '' } = useParams();
  const { studioId, canEdit } = useActiveStudio();
  const navigate = useNavigate();
  const plan = usePlan(studioId, planId);
  const kit = useKit(studioId);
  const duplicate = useDuplicatePlan(studioId);
  const remove = useDeletePlan(studioId);
  const p = plan.data;

  return (
    <QueryState isPending={plan.isPending} error={plan.error} label="plan">
      {p ? (
        <>
          <PageHeader title={p.name}>
            <Link to={paths.planPrint(p.id)} className={linkButton}>Print</Link>
            {canEdit ? (
              <>
                <Link to={`${paths.planner}?plan=${p.id}`} className={linkButton}>Edit in planner</Link>
                <Button variant="secondary" disabled={duplicate.isPending} onClick={() => duplicate.mutate(p.id, { onSuccess: (copy) => navigate(paths.plan(copy.id)) })}>Duplicate</Button>
                <Button variant="danger" disabled={remove.isPending} onClick={() => { if (window.confirm(`Delete the plan “${p.name}”?`)) remove.mutate(p.id, { onSuccess: () => navigate(paths.planner) }); }}>Delete</Button>
              </>
            ) : null}
          </PageHeader>
          <ErrorNote error={duplicate.error ?? remove.error ?? kit.error} />
          <p className="mb-6 text-sm text-slate">
            Updated {new Date(p.updatedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}
            {canEdit ? '' : ' · read-only'}
          </p>
          {p.notes ? <p className="mb-6 max-w-prose whitespace-pre-line">{p.notes}</p> : null}
          <div className="grid gap-8 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
            <section aria-labelledby="inputs-h" className="min-w-0">
              <h2 id="inputs-h" className="mb-3 text-lg font-semibold">Inputs</h2>
              <PlanInputs plan={p} kit={kit.data} />
            </section>
            <div className="flex min-w-0 flex-col gap-8">
              <section aria-labelledby="results-h">
                <h2 id="results-h" className="mb-3 text-lg font-semibold">Results</h2>
                <PlanFigures plan={p.result} railStepUm={p.inputs.railStepUm} stableSeconds={p.inputs.stableSeconds} />
              </section>
              <section aria-labelledby="cautions-h">
                <h2 id="cautions-h" className="mb-3 text-lg font-semibold">Cautions</h2>
                <PlanCautions warnings={[...p.result.warnings, ...p.sweep.warnings]} />
              </section>
              <section aria-labelledby="sweep-h" className="flex flex-col gap-3">
                <h2 id="sweep-h" className="text-lg font-semibold">Aperture sweep</h2>
                <SweepChart sweep={p.sweep} />
                <SweepTable sweep={p.sweep} />
              </section>
              <section aria-labelledby="depth-h">
                <h2 id="depth-h" className="mb-3 text-lg font-semibold">Depth and frames</h2>
                <DepthChart depthMm={p.inputs.depthMm} stepMm={p.result.stepMm} frames={p.result.frames} />
              </section>
            </div>
          </div>
        </>
      ) : null}
    </QueryState>
  );
}
