import { CHECK_GLYPHS, CHECK_GLYPH_STROKE_WIDTH } from '@shared/check-glyphs';
import type { CheckCode } from '@shared/schemas/checks';

/** A check's glyph, the same shape as on the contact sheet; its label is spoken and shown on hover. */
export function CheckGlyph({ code, sizePx = 14 }: { code: CheckCode; sizePx?: number }) {
  const g = CHECK_GLYPHS[code];
  return (
    <svg viewBox={g.viewBox} width={sizePx} height={sizePx} role="img" aria-label={g.label} className="inline-block shrink-0">
      <title>{g.label}</title>
      {g.paths.map((p) => (
        <path key={p.d} d={p.d} fill={p.paint === 'fill' ? g.colourHex : 'none'} stroke={p.paint === 'stroke' ? g.colourHex : 'none'} strokeWidth={CHECK_GLYPH_STROKE_WIDTH} />
      ))}
    </svg>
  );
}
