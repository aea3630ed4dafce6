import type { StackFrameView } from '@shared/schemas/bundles';
import { EmptyState } from '@/components/query-state';
import { exposure, fNumber } from '@/lib/units';
import { clockNote } from '@/lib/capture-time';
import { captureTime } from '../lib/format';
import { FrameMark } from './frame-mark';

interface Props {
  frames: StackFrameView[];
  stackName: string;
  previewUrl: (frameId: string) => string;
}

/** The frames in stack order, small, with their settings and marks; excluded ones struck through. */
export function StackFrameGrid({ frames, stackName, previewUrl }: Props) {
  if (frames.length === 0) return <EmptyState title="This stack has no frames.">Move frames into it on the session’s sorting page.</EmptyState>;
  return (
    <section aria-labelledby="frames-h" className="mt-8">
      <h2 id="frames-h" className="mb-2 text-lg font-semibold">Frames in order</h2>
      <p className="mb-3 text-sm text-slate">Numbers are the frames’ places in the stack; the bundle numbers its files without the excluded frames.</p>
      <ol className="grid grid-cols-[repeat(auto-fill,minmax(8.5rem,1fr))] gap-2" aria-label={`Frames of ${stackName}`}>
        {frames.map((f) => (
          <li
            key={f.id}
            aria-label={`Frame ${f.number}${f.bundleNumber ? `, bundle number ${f.bundleNumber}` : ', excluded from the bundle'}: ${f.fileName}`}
            className={`rounded border p-1 text-xs ${f.excluded ? 'border-clay/40 bg-clay/5' : 'border-rule bg-card'}`}
          >
            <Thumb frame={f} url={previewUrl(f.id)} />
            <div className="num mt-1 flex items-center justify-between gap-1">
              <span className={`font-semibold ${f.excluded ? 'text-clay line-through' : ''}`}>{f.number}</span>
              <span className="text-slate" title={clockNote(f.captureOffsetMinutes)}>{captureTime(f.captureTimeMs, f.captureOffsetMinutes)}</span>
            </div>
            <div className="num text-slate">
              {f.exposureTimeS === null ? '—' : exposure(f.exposureTimeS)} · {f.fNumber === null ? 'f/—' : fNumber(f.fNumber)} · {f.iso === null ? 'ISO —' : `ISO ${f.iso}`}
            </div>
            <div className="mt-0.5 flex min-h-4 flex-wrap items-center gap-1">
              {f.excluded ? <span className="font-medium text-clay">excluded</span> : <span className="num text-slate">file {String(f.bundleNumber).padStart(3, '0')}</span>}
              {f.files.length > 1 ? <span className="text-slate" title={f.files.map((x) => x.name).join(' + ')}>RAW+</span> : null}
              {f.checkCodes.map((code) => <FrameMark key={code} code={code} />)}
            </div>
          </li>
        ))}
      </ol>
    </section>
  );
}

function Thumb({ frame, url }: { frame: StackFrameView; url: string }) {
  const box = 'flex h-20 w-full items-center justify-center overflow-hidden rounded-sm bg-rule/40';
  if (frame.previewStatus === 'done') {
    return (
      <span className={box}>
        <img src={url} alt="" loading="lazy" className={`max-h-full max-w-full object-contain ${frame.excluded ? 'opacity-50' : ''}`} />
      </span>
    );
  }
  if (frame.previewStatus === 'failed') {
    return <span className={`${box} px-1 text-center text-[0.65rem] leading-tight text-clay`} title={frame.previewError ?? undefined}>no preview</span>;
  }
  return <span className={`${box} text-slate`}>preview…</span>;
}
