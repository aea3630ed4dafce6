import { PageHeader, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useKit } from '@/features/kit/api/get-kit';
import { KitSection } from '@/features/kit/components/kit-section';
import { KIND_CONFIGS } from '@/features/kit/components/kit-kinds';

export function Component() {
  const { studioId, canEdit } = useActiveStudio();
  const kit = useKit(studioId);
  return (
    <>
      <PageHeader title="Kit" />
      <p className="mb-6 max-w-prose text-sm text-slate">
        The studio’s gear, for the planner. {canEdit ? 'Owners and photographers keep it up to date.' : 'Owners and photographers keep it up to date; you can read it.'}
      </p>
      <QueryState isPending={kit.isPending} error={kit.error} label="kit">
        {kit.data ? (
          <>
            <KitSection studioId={studioId} config={KIND_CONFIGS.bodies} items={kit.data.bodies} canEdit={canEdit} />
            <KitSection studioId={studioId} config={KIND_CONFIGS.lenses} items={kit.data.lenses} canEdit={canEdit} />
            <KitSection studioId={studioId} config={KIND_CONFIGS['extension-sets']} items={kit.data.extensionSets} canEdit={canEdit} />
            <KitSection studioId={studioId} config={KIND_CONFIGS.rails} items={kit.data.rails} canEdit={canEdit} />
          </>
        ) : null}
      </QueryState>
    </>
  );
}
