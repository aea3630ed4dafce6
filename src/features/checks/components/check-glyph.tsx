import { CHECK_GLYPHS, CHECK_GLYPH_STROKE_WIDTH } from '@shared/check-glyphs';
import type { CheckCode } from '@shared/schemas/checks';

/**
 * A check's glyph, the same shape as on the contact sheet and in the manifest legend. With
 * `decorative` it is hidden from screen readers (for use beside the check's name in words).
 */
export function CheckGlyph({ code, sizePx = 14, decorative = false }: { code: CheckCode; sizePx?: number; decorative?: boolean }) {
  const g = CHECK_GLYPHS[code];
  return (
    <svg
      viewBox={g.viewBox}
      width={sizePx}
      height={sizePx}
      className="inline-block shrink-0"
      {...(decorative ? { 'aria-hidden': true } : { role: 'img', 'aria-label': g.label })}
    >
      {decorative ? null : <title>{g.label}</title>}
      <GlyphPaths code={code} />
    </svg>
  );
}

/** The glyph's paths in its 16 x 16 box, for drawing inside another SVG. */
export function GlyphPaths({ code }: { code: CheckCode }) {
  const g = CHECK_GLYPHS[code];
  return (
    <>
      {g.paths.map((p) => (
        <path key={p.d} d={p.d} fill={p.paint === 'fill' ? g.colourHex : 'none'} stroke={p.paint === 'stroke' ? g.colourHex : 'none'} strokeWidth={CHECK_GLYPH_STROKE_WIDTH} />
      ))}
    </>
  );
}
