import { CHECK_GLYPHS, CHECK_GLYPH_STROKE_WIDTH } from '@shared/check-glyphs';
import { checkCodeSchema } from '@shared/schemas/checks';
import { flagWords } from '../lib/format';

/** A check's glyph (the same shape as on the contact sheet), or a short word for any other mark. */
export function FrameMark({ code, sizePx = 13 }: { code: string; sizePx?: number }) {
  const known = checkCodeSchema.safeParse(code);
  if (!known.success) return <span className="rounded border border-clay/40 px-1 text-[0.65rem] text-clay">{flagWords(code)}</span>;
  const g = CHECK_GLYPHS[known.data];
  return (
    <svg viewBox={g.viewBox} width={sizePx} height={sizePx} role="img" aria-label={g.label} className="inline-block shrink-0">
      <title>{g.label}</title>
      {g.paths.map((p) => (
        <path key={p.d} d={p.d} fill={p.paint === 'fill' ? g.colourHex : 'none'} stroke={p.paint === 'stroke' ? g.colourHex : 'none'} strokeWidth={CHECK_GLYPH_STROKE_WIDTH} />
      ))}
    </svg>
  );
}
