import { Link } from 'react-router';
import { PageHeader } from '@/components/query-state';
import { paths } from '../paths';

/** Where a retoucher lands on a page their role cannot read: what is kept from them, and where their work is. */
export function RetoucherElsewhere({ title }: { title: string }) {
  return (
    <>
      <PageHeader title={title} />
      <div className="max-w-prose rounded border border-rule bg-card px-4 py-3" data-testid="not-for-role">
        <p className="font-medium text-ink">Sessions are not shown to retouchers.</p>
        <p className="mt-1 text-sm text-slate">
          Shoots, cards and draft stacks stay with the studio’s owners, photographers and guests. The stacks handed to you — with their
          contact sheets, bundles and the merged results you send back — are on your own page.
        </p>
        <Link to={paths.handoffs} className="mt-3 inline-block font-medium text-moss underline underline-offset-2">Go to Handed to me</Link>
      </div>
    </>
  );
}
