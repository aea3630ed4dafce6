import { PageHeader, EmptyState } from '@/components/query-state';

export function Component() {
  return (
    <>
      <PageHeader title="Sessions" />
      <EmptyState title="Nothing here yet">This section is being built.</EmptyState>
    </>
  );
}
