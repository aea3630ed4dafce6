import type { FrameView } from '@shared/schemas/session-views';
import { aperture, captureTime, flagLabel, isoSpeed, shutter } from '../lib/format';
import { CheckGlyph } from './check-glyph';
import { CHECK_GLYPHS } from '@shared/check-glyphs';
import type { CheckCode } from '@shared/schemas/checks';
import { clockNote } from '@/lib/capture-time';

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

const isCheckCode = (code: string): code is CheckCode => code in CHECK_GLYPHS;

// Flags about the file itself (shown as words); the stack checks' findings show as glyphs.
const quietFlags = new Set(['exposure-change', 'no-preview']);

/** One frame: a small preview, its number, time and exposure; a button that selects it where it may be edited. */
export function FrameTile({ frame, number, previewUrl, selected, selectable, context, onToggle }: Props) {
  const fileFlags = frame.flags.filter((f) => !quietFlags.has(f));
  const box = `flex w-full flex-col rounded border p-1 text-left text-xs ${selected ? 'border-moss bg-moss/10 ring-2 ring-moss' : 'border-rule bg-card'} ${frame.excluded ? 'opacity-60' : ''}`;
  const body = (
    <>
      <span className="sr-only">
        Frame {number} of {context}: {frame.fileName}{frame.excluded ? ', excluded' : ''}{frame.checkCodes.length ? `, marked by the checks` : ''}{fileFlags.length ? `, ${fileFlags.map(flagLabel).join(', ')}` : ''}.
      </span>
      <Thumb frame={frame} url={previewUrl} />
      <span className="num mt-1 flex items-center justify-between gap-1">
        <span className="font-semibold">{number}</span>
        <span className="text-slate" title={clockNote(frame.captureOffsetMinutes)}>{captureTime(frame.captureTimeMs, frame.captureOffsetMinutes)}</span>
      </span>
      <span className="num truncate text-slate">{shutter(frame.exposureTimeS)} · {aperture(frame.fNumber)}</span>
      <span className="num flex items-center justify-between gap-1 text-slate">
        <span>{isoSpeed(frame.iso)}</span>
        <span className="flex items-center gap-0.5">
          {frame.checkCodes.filter(isCheckCode).map((code) => <CheckGlyph key={code} code={code} sizePx={12} />)}
          {frame.files.length > 1 ? <span title="RAW and picture of one exposure">RAW+</span> : null}
        </span>
      </span>
      {frame.excluded ? <span className="font-medium text-clay line-through decoration-clay/60">excluded</span> : null}
      {fileFlags.length ? <span className="truncate text-clay" title={fileFlags.map(flagLabel).join(', ')}>{flagLabel(fileFlags[0])}{fileFlags.length > 1 ? ` +${fileFlags.length - 1}` : ''}</span> : null}
    </>
  );
  // A frame that cannot be selected here is no button: the keyboard skips it instead of stopping at a control that does nothing.
  return (
    <li className="w-[7.5rem] shrink-0">
      {selectable ? (
        <button type="button" aria-pressed={selected} onClick={onToggle} title={frame.fileName} className={`${box} hover:border-slate`}>{body}</button>
      ) : (
        <div title={frame.fileName} className={box}>{body}</div>
      )}
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
