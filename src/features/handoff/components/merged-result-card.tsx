import type { MergedResultView } from '@shared/schemas/handoff';
import { count } from '@/lib/units';
import { bytes, when } from '../lib/format';

interface Props {
  result: MergedResultView;
  stackName: string;
  previewUrl: string;
  fileUrl: string;
}

/** The merged picture sent back: its preview once the worker made it, its facts, its download. */
export function MergedResultCard({ result, stackName, previewUrl, fileUrl }: Props) {
  return (
    <figure className="space-y-2">
      {result.previewStatus === 'done' ? (
        <a href={previewUrl} target="_blank" rel="noreferrer" className="block w-fit" title="Open the large preview">
          <img src={previewUrl} alt={`Merged result of ${stackName}`} className="max-h-72 max-w-full rounded border border-rule" />
        </a>
      ) : result.previewStatus === 'pending' ? (
        <p className="text-sm text-slate" role="status">Making the preview of the merged result…</p>
      ) : (
        <p className="text-sm text-clay" role="alert">{result.previewError ?? 'The preview could not be made.'}</p>
      )}
      {result.previewStatus === 'done' && result.previewError ? <p className="text-sm text-amber">{result.previewError}</p> : null}
      <figcaption className="num text-sm">
        <span className="font-medium">{result.originalName}</span>
        <span className="text-slate"> · {bytes(result.sizeBytes)}{result.widthPx ? ` · ${count(result.widthPx)} × ${count(result.heightPx ?? 0)} px` : ''} · from {result.uploadedBy}, {when(result.uploadedAt)}</span>
      </figcaption>
      <a href={fileUrl} download className="inline-block text-sm text-moss hover:underline">Download the merged file</a>
    </figure>
  );
}
