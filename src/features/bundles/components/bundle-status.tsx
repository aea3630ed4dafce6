import type { BundleView } from '@shared/schemas/bundles';
import { ProgressBar } from '@/components/progress-bar';
import { bundleDownloadUrl } from '../api/get-bundle';
import { bytes, when } from '../lib/format';

interface Props {
  studioId: string;
  bundle: BundleView;
  canDownload: boolean;
  /** What the bundle holds, for the progress bar's label. */
  what: string;
}

/** One bundle: its progress while being made, its download when done, its error if it failed. */
export function BundleStatus({ studioId, bundle, canDownload, what }: Props) {
  if (bundle.status === 'queued' || bundle.status === 'running') {
    return (
      <div role="status" className="space-y-1">
        <p className="text-sm">{bundle.status === 'queued' ? 'Waiting for the worker…' : 'Making the bundle…'}</p>
        <div className="flex max-w-md items-center gap-3">
          <ProgressBar percent={bundle.progress} label={`Bundle of ${what}`} />
          <span className="num w-12 shrink-0 text-right text-sm text-slate">{Math.round(bundle.progress)} %</span>
        </div>
      </div>
    );
  }
  if (bundle.status === 'failed') return <p role="alert" className="text-sm text-clay">{bundle.error ?? 'The bundle could not be made.'}</p>;
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
      {canDownload ? (
        <a href={bundleDownloadUrl(studioId, bundle.id)} download={bundle.fileName} className="inline-flex items-center rounded bg-moss px-3 py-1.5 font-medium text-white hover:bg-[#275d4f]">
          Download {bundle.fileName}
        </a>
      ) : (
        <span className="text-slate">Bundles hold the original files: guests see the contact sheet only.</span>
      )}
      <span className="num text-slate">{bytes(bundle.bytes)} · made {when(bundle.finishedAt)}</span>
    </div>
  );
}
