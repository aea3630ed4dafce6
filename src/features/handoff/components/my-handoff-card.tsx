import { useQueryClient } from '@tanstack/react-query';
import type { MyHandoffRow } from '@shared/schemas/handoff';
import { STACK_STATE_LABELS } from '@shared/handoff-rules';
import { count } from '@/lib/units';
import { askForMemberBundle } from '../api/ask-for-bundle';
import { memberBundleUrl, mergedFileUrl, mergedPreviewUrl } from '../api/get-handoff';
import { myHandoffsQueryOptions, stackContactSheetUrl } from '../api/get-my-handoffs';
import { memberMergedUrl } from '../api/upload-merged';
import { shootDay, when } from '../lib/format';
import { BundleDownload } from './bundle-download';
import { MergedResultCard } from './merged-result-card';
import { MergedUpload } from './merged-upload';

/** One stack handed to the signed-in retoucher: its contact sheet, bundle, and the merged result. */
export function MyHandoffCard({ studioId, row, highlighted }: { studioId: string; row: MyHandoffRow; highlighted: boolean }) {
  const qc = useQueryClient();
  const refresh = () => void qc.invalidateQueries({ queryKey: myHandoffsQueryOptions(studioId).queryKey });
  const headingId = `handoff-${row.stackId}`;
  const sheet = stackContactSheetUrl(studioId, row.stackId, row.version);
  return (
    <article aria-labelledby={headingId} className={`grid gap-4 rounded border bg-card p-4 md:grid-cols-[minmax(0,2fr)_minmax(0,3fr)] ${highlighted ? 'border-moss' : 'border-rule'}`}>
      <div>
        {row.contactSheetAvailable ? (
          <a href={sheet} target="_blank" rel="noreferrer" className="block w-fit" title="Open the full contact sheet">
            <img src={sheet} alt={`Contact sheet of ${row.stackName}: ${count(row.frameCount)} frames in order`} className="max-h-64 max-w-full rounded border border-rule" />
          </a>
        ) : (
          <p className="rounded border border-dashed border-rule p-6 text-center text-sm text-slate" role="status">The contact sheet is being made…</p>
        )}
      </div>
      <div className="space-y-3">
        <header>
          <h2 id={headingId} className="text-lg font-semibold">{row.stackName}</h2>
          <p className="text-sm text-slate">
            {row.sessionTitle} · shot {shootDay(row.shootDate)} · <span className="num">{count(row.frameCount)}</span> frames
          </p>
          <p className="text-sm">
            <span className="rounded bg-moss/10 px-2 py-0.5 font-medium text-moss">{STACK_STATE_LABELS[row.state]}</span>
            <span className="ml-2 text-slate">from {row.handedOffBy || 'the studio'}, {when(row.handedOffAt)}</span>
          </p>
        </header>
        <BundleDownload
          status={row.bundle.status} sizeBytes={row.bundle.sizeBytes} href={memberBundleUrl(studioId, row.stackId)} stackName={row.stackName}
          ask={() => askForMemberBundle(studioId, row.stackId)} onAsked={refresh}
        />
        {row.mergedResult ? (
          <MergedResultCard result={row.mergedResult} stackName={row.stackName} previewUrl={mergedPreviewUrl(studioId, row.stackId, row.mergedResult.id)} fileUrl={mergedFileUrl(studioId, row.stackId)} />
        ) : null}
        {row.state === 'handed-off' ? <MergedUpload url={memberMergedUrl(studioId, row.stackId)} stackName={row.stackName} onUploaded={refresh} /> : null}
      </div>
    </article>
  );
}
