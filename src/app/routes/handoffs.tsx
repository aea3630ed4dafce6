import { useSearchParams } from 'react-router';
import { EmptyState, PageHeader, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useMyHandoffs } from '@/features/handoff/api/get-my-handoffs';
import { MyHandoffCard } from '@/features/handoff/components/my-handoff-card';

/** The retoucher's list: every stack handed to them that is still to merge, or just merged. */
export function Component() {
  const { studioId, studioName } = useActiveStudio();
  const handoffs = useMyHandoffs(studioId);
  const [params] = useSearchParams();
  const highlighted = params.get('stack');
  const rows = handoffs.data ?? [];
  return (
    <>
      <PageHeader title="Handed to me" />
      <QueryState isPending={handoffs.isPending} error={handoffs.error} label="the stacks handed to you">
        {rows.length === 0 ? (
          <EmptyState title="Nothing is handed to you right now">
            When a photographer of {studioName} hands you a stack, it appears here with its contact sheet and bundle, and you send the merged picture back from here.
          </EmptyState>
        ) : (
          <div className="space-y-4">
            <p className="text-sm text-slate">
              {rows.filter((r) => r.state === 'handed-off').length} to merge, {rows.filter((r) => r.state === 'merged').length} merged. Download a bundle, merge it in your software, and upload the merged JPEG or TIFF.
            </p>
            {rows.map((row) => <MyHandoffCard key={row.stackId} studioId={studioId} row={row} highlighted={row.stackId === highlighted} />)}
          </div>
        )}
      </QueryState>
    </>
  );
}
