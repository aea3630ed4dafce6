import type { FrameView } from '@shared/schemas/session-views';
import { aperture, captureTime, flagLabel, isoSpeed, shutter } from '../lib/format';
import { CheckGlyph } from './check-glyph';

interface Props {
  frame: FrameView;
  /** 1-based place in its stack, or among the loose frames. */
  number: number;
  previewUrl: string;
  selected: boolean;
  selectable: boolean;
  context: string;
  onToggle: () => void;
}

// Flags about the file itself (shown as words); exposure changes get the check glyph instead.
const quietFlags = new Set(['exposure-change', 'no-preview']);

/** One frame: a small preview, its number, time and exposure; a button that selects it. */
export function FrameTile({ frame, number, previewUrl, selected, selectable, context, onToggle }: Props) {
  const fileFlags = frame.flags.filter((f) => !quietFlags.has(f));
  return (
    <li className="w-[7.5rem] shrink-0">
      <button
        type="button"
        aria-pressed={selectable ? selected : undefined}
        onClick={selectable ? onToggle : undefined}
        title={frame.fileName}
        className={`flex w-full flex-col rounded border p-1 text-left text-xs ${selected ? 'border-moss bg-moss/10 ring-2 ring-moss' : 'border-rule bg-card hover:border-slate'} ${frame.excluded ? 'opacity-60' : ''}`}
      >
        <span className="sr-only">
          Frame {number} of {context}: {frame.fileName}{frame.excluded ? ', excluded' : ''}{fileFlags.length ? `, ${fileFlags.map(flagLabel).join(', ')}` : ''}.
        </span>
        <Thumb frame={frame} url={previewUrl} />
        <span className="num mt-1 flex items-center justify-between gap-1">
          <span className="font-semibold">{number}</span>
          <span className="text-slate">{captureTime(frame.captureTimeMs)}</span>
        </span>
        <span className="num truncate text-slate">{shutter(frame.exposureTimeS)} · {aperture(frame.fNumber)}</span>
        <span className="num flex items-center justify-between gap-1 text-slate">
          <span>{isoSpeed(frame.iso)}</span>
          <span className="flex items-center gap-0.5">
            {frame.flags.includes('exposure-change') ? <CheckGlyph code="exposure-jump" sizePx={12} /> : null}
            {frame.files.length > 1 ? <span title="RAW and picture of one exposure">RAW+</span> : null}
          </span>
        </span>
        {frame.excluded ? <span className="font-medium text-clay line-through decoration-clay/60">excluded</span> : null}
        {fileFlags.length ? <span className="truncate text-clay" title={fileFlags.map(flagLabel).join(', ')}>{flagLabel(fileFlags[0])}{fileFlags.length > 1 ? ` +${fileFlags.length - 1}` : ''}</span> : null}
      </button>
    </li>
  );
}

function Thumb({ frame, url }: { frame: FrameView; url: string }) {
  const box = 'flex h-16 w-full items-center justify-center overflow-hidden rounded-sm bg-rule/40';
  if (frame.previewStatus === 'done') {
    return (
      <span className={box}>
        <img src={url} alt="" loading="lazy" className="max-h-full max-w-full object-contain" />
      </span>
    );
  }
  if (frame.previewStatus === 'failed') {
    return <span className={`${box} px-1 text-center text-[0.65rem] leading-tight text-clay`} title={frame.previewError ?? undefined}>{frame.previewError ?? 'Preview could not be made'}</span>;
  }
  return <span className={`${box} text-slate`}>preview…</span>;
}
