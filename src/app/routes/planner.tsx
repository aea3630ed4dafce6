import { useDeferredValue, useMemo, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router';
import { apertureSweep, planStack } from '@shared/optics';
import type { Kit } from '@shared/schemas/kit';
import type { PlanView } from '@shared/schemas/plan';
import { EmptyState, ErrorNote, PageHeader, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useKit } from '@/features/kit/api/get-kit';
import { usePlan } from '@/features/plans/api/get-plan';
import { usePlans } from '@/features/plans/api/get-plans';
import { useCreatePlan } from '@/features/plans/api/create-plan';
import { useUpdatePlan } from '@/features/plans/api/update-plan';
import { PlannerForm } from '@/features/plans/components/planner-form';
import { PlanFigures } from '@/features/plans/components/plan-figures';
import { PlanCautions } from '@/features/plans/components/plan-cautions';
import { SweepChart, SweepTable } from '@/features/plans/components/sweep-chart';
import { DepthChart } from '@/features/plans/components/depth-chart';
import { SavePlanForm } from '@/features/plans/components/save-plan-form';
import { PlansTable } from '@/features/plans/components/plans-table';
import { DEFAULT_PLANNER_STATE, derive, fieldForPath, kitOf, stateFromPlan, type FieldErrors, type PlannerState } from '@/features/plans/lib/planner-state';
import { ApiError } from '@/lib/api-client';
import { paths } from '../paths';

const EMPTY_KIT: Kit = { bodies: [], lenses: [], extensionSets: [], rails: [] };

export function Component() {
  const { studioId } = useActiveStudio();
  const [params] = useSearchParams();
  const editId = params.get('plan') ?? undefined;
  const kit = useKit(studioId);
  const existing = usePlan(studioId, editId);
  const plans = usePlans(studioId);
  const ready = !kit.isPending && (!editId || !existing.isPending);

  return (
    <>
      <PageHeader title={existing.data ? `Planner: ${existing.data.name}` : 'Planner'} />
      {kit.error || existing.error ? (
        <div className="mb-4">
          <ErrorNote error={kit.error ?? existing.error} />
          <p className="mt-1 text-sm text-slate">{kit.error ? 'The kit could not be read; the planner still works with typed values.' : 'The plan to edit could not be read; this is a new plan.'}</p>
        </div>
      ) : null}
      {ready ? (
        <Workspace key={existing.data?.id ?? 'new'} kit={kit.data ?? EMPTY_KIT} existing={existing.data} />
      ) : (
        <p role="status" className="text-slate">Loading the kit…</p>
      )}
      <section aria-labelledby="plans-h" className="mt-12">
        <h2 id="plans-h" className="mb-3 text-lg font-semibold">Saved plans</h2>
        <QueryState isPending={plans.isPending} error={plans.error} label="plans">
          {plans.data?.length ? (
            <PlansTable plans={plans.data} planHref={(id) => paths.plan(id)} />
          ) : (
            <EmptyState title="No saved plans yet">Plans saved by owners and photographers appear here for the whole studio.</EmptyState>
          )}
        </QueryState>
      </section>
    </>
  );
}

function Workspace({ kit, existing }: { kit: Kit; existing?: PlanView }) {
  const { studioId, canEdit } = useActiveStudio();
  const navigate = useNavigate();
  const [state, setState] = useState<PlannerState>(() => (existing ? stateFromPlan(existing.inputs, existing.kit, existing.focusingMethod) : DEFAULT_PLANNER_STATE));
  const [serverErrors, setServerErrors] = useState<FieldErrors>({});
  const create = useCreatePlan(studioId);
  const update = useUpdatePlan(studioId);
  const lens = kit.lenses.find((l) => l.id === state.lensId);
  const derived = useMemo(() => derive(state, lens), [state, lens]);
  const input = useDeferredValue(derived.input);
  const computed = useMemo(() => (input ? { plan: planStack(input), sweep: apertureSweep(input) } : null), [input]);
  const errors = { ...serverErrors, ...derived.errors };

  const change = (next: PlannerState) => {
    setState(next);
    setServerErrors({});
  };
  const onError = (err: unknown) => {
    if (!(err instanceof ApiError) || !err.details) return;
    const mapped: FieldErrors = {};
    for (const d of err.details) {
      const key = fieldForPath(d.path);
      if (key) mapped[key] ??= d.message;
    }
    setServerErrors(mapped);
  };
  const save = (meta: { name: string; notes: string }, asNew: boolean) => {
    if (!derived.input) return;
    const body = { ...meta, inputs: derived.input, kit: kitOf(state), focusingMethod: state.focusingMethod };
    const done = { onSuccess: (saved: PlanView) => navigate(paths.plan(saved.id)), onError };
    if (existing && !asNew) update.mutate({ planId: existing.id, change: body }, done);
    else create.mutate(body, done);
  };

  return (
    <div className="grid gap-8 lg:grid-cols-[minmax(0,25rem)_minmax(0,1fr)]">
      <PlannerForm kit={kit} state={state} onChange={change} errors={errors} cocMm={derived.cocMm} />
      <div className="flex min-w-0 flex-col gap-8">
        <section aria-labelledby="results-h">
          <h2 id="results-h" className="mb-3 text-lg font-semibold">Results</h2>
          {computed ? (
            <PlanFigures plan={computed.plan} railStepUm={input?.railStepUm} stableSeconds={input?.stableSeconds} />
          ) : (
            <p role="status" className="rounded border border-clay/40 bg-clay/5 px-3 py-2 text-sm text-clay">Fix the marked fields to see the figures.</p>
          )}
        </section>
        <section aria-labelledby="cautions-h">
          <h2 id="cautions-h" className="mb-3 text-lg font-semibold">Cautions</h2>
          <PlanCautions warnings={computed ? [...computed.plan.warnings, ...computed.sweep.warnings] : []} />
        </section>
        {computed && input ? (
          <>
            <section aria-labelledby="sweep-h" className="flex flex-col gap-3">
              <h2 id="sweep-h" className="text-lg font-semibold">Aperture sweep</h2>
              <SweepChart sweep={computed.sweep} />
              <SweepTable sweep={computed.sweep} />
            </section>
            <section aria-labelledby="depth-h">
              <h2 id="depth-h" className="mb-3 text-lg font-semibold">Depth and frames</h2>
              <DepthChart depthMm={input.depthMm} stepMm={computed.plan.stepMm} frames={computed.plan.frames} />
            </section>
          </>
        ) : null}
        {canEdit ? (
          <section aria-labelledby="save-h">
            <h2 id="save-h" className="mb-3 text-lg font-semibold">Save</h2>
            <SavePlanForm
              initialName={existing?.name}
              initialNotes={existing?.notes}
              editing={Boolean(existing)}
              disabled={!derived.input}
              pending={create.isPending || update.isPending}
              error={create.error ?? update.error}
              onSave={save}
            />
          </section>
        ) : (
          <p className="text-sm text-slate">Your role can try figures here; owners and photographers save plans.</p>
        )}
      </div>
    </div>
  );
}
