import { useQueryClient } from '@tanstack/react-query';
import type { SharePageView } from '@shared/schemas/handoff';
import { STACK_STATE_LABELS } from '@shared/handoff-rules';
import { count } from '@/lib/units';
import { askForShareBundle } from '../api/ask-for-bundle';
import { shareBundleUrl, shareContactSheetUrl, shareQueryOptions } from '../api/get-share';
import { shareMergedUrl } from '../api/upload-merged';
import { bytes, shootDay, timeLeft, when } from '../lib/format';
import { BundleDownload } from './bundle-download';
import { MergedUpload } from './merged-upload';

/** What a share link opens for an outside retoucher: contact sheet, bundle, and the merged upload. */
export function ShareView({ token, view }: { token: string; view: SharePageView }) {
  const qc = useQueryClient();
  const key = shareQueryOptions(token).queryKey;
  const refresh = () => void qc.invalidateQueries({ queryKey: key });
  return (
    <div className="space-y-5">
      <header>
        <p className="text-sm tracking-wide text-slate">{view.studioName} sent you a stack to merge</p>
        <h1 className="text-2xl font-semibold">{view.stackName}</h1>
        <p className="text-sm text-slate">
          {view.sessionTitle} · shot {shootDay(view.shootDate)} · <span className="num">{count(view.frameCount)}</span> frames ·{' '}
          <span className="rounded bg-moss/10 px-2 py-0.5 font-medium text-moss">{STACK_STATE_LABELS[view.state]}</span>
        </p>
        <p className="num mt-1 text-sm">
          For {view.email}. This link works until {when(view.expiresAt)} ({timeLeft(view.expiresAt)}); the bundle was downloaded {count(view.downloadCount)} time{view.downloadCount === 1 ? '' : 's'} through it.
        </p>
      </header>

      <section aria-labelledby="share-sheet-h" className="space-y-2">
        <h2 id="share-sheet-h" className="text-lg font-semibold">Contact sheet</h2>
        {view.contactSheetAvailable ? (
          <a href={shareContactSheetUrl(token)} target="_blank" rel="noreferrer" className="block w-fit" title="Open the full contact sheet">
            <img src={shareContactSheetUrl(token)} alt={`Contact sheet of ${view.stackName}: ${count(view.frameCount)} frames in order, numbered as in the bundle`} className="max-h-[32rem] max-w-full rounded border border-rule" />
          </a>
        ) : (
          <p className="text-sm text-slate" role="status">The contact sheet is being made; this page checks again by itself.</p>
        )}
      </section>

      <section aria-labelledby="share-bundle-h" className="space-y-2">
        <h2 id="share-bundle-h" className="text-lg font-semibold">Bundle</h2>
        <p className="text-sm text-slate">One zip: the original files renamed in stack order, a manifest (CSV and JSON) and the contact sheet.</p>
        <BundleDownload
          status={view.bundle.status} sizeBytes={view.bundle.sizeBytes} href={shareBundleUrl(token)} stackName={view.stackName}
          ask={() => askForShareBundle(token)} onAsked={refresh}
        />
      </section>

      <section aria-labelledby="share-merged-h" className="space-y-2">
        <h2 id="share-merged-h" className="text-lg font-semibold">Merged result</h2>
        {view.mergedResult ? (
          <p className="text-sm" role="status">
            Received {view.mergedResult.originalName} ({bytes(view.mergedResult.sizeBytes)}) on {when(view.mergedResult.uploadedAt)}. Thank you — {view.studioName} has been told.
          </p>
        ) : null}
        {view.canUploadMerged ? (
          <MergedUpload<{ share: SharePageView }> url={shareMergedUrl(token)} stackName={view.stackName} onUploaded={(r) => qc.setQueryData(key, r.share)} />
        ) : null}
      </section>
    </div>
  );
}
