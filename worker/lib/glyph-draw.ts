import { CHECK_GLYPH_STROKE_WIDTH, CHECK_GLYPHS } from '@shared/check-glyphs';
import { checkCodeSchema } from '@shared/schemas/checks';

// Drawing of the check glyphs on the contact sheets. The shapes come from shared/check-glyphs.ts
// (paths in a 16 × 16 box), so the app, the JPEG (SVG via librsvg), the PDF (pdfkit's SVG-path
// support) and the manifest legend show the same figure.

export interface GlyphPart {
  d: string;
  paint: 'fill' | 'stroke';
}

export interface GlyphDrawing {
  code: string;
  label: string;
  meaning: string;
  colourHex: string;
  shape: string;
  parts: GlyphPart[];
}

export const GLYPH_BOX = 16;
const STROKE_WIDTH = CHECK_GLYPH_STROKE_WIDTH;
const INK = '#1F2A30';

export const KNOWN_CHECK_CODES: readonly string[] = checkCodeSchema.options;

/** A check's glyph; any other flag (e.g. a missing capture time) gets a plain ink ring. */
export function glyphFor(code: string): GlyphDrawing {
  const parsed = checkCodeSchema.safeParse(code);
  if (parsed.success) {
    const known = CHECK_GLYPHS[parsed.data];
    return { code, label: known.label, meaning: known.meaning, colourHex: known.colourHex, shape: known.shape, parts: known.paths };
  }
  return {
    code,
    label: code.replace(/-/g, ' '),
    meaning: '',
    colourHex: INK,
    shape: 'ring',
    parts: [{ d: 'M8 3 A5 5 0 1 1 8 13 A5 5 0 1 1 8 3 Z', paint: 'stroke' }],
  };
}

/** SVG fragment for one glyph whose top-left corner is at (x, y), sizePx wide. */
export function glyphSvg(code: string, x: number, y: number, sizePx: number): string {
  const glyph = glyphFor(code);
  const scale = sizePx / GLYPH_BOX;
  const paths = glyph.parts
    .map((part) =>
      part.paint === 'fill'
        ? `<path d="${part.d}" fill="${glyph.colourHex}"/>`
        : `<path d="${part.d}" fill="none" stroke="${glyph.colourHex}" stroke-width="${STROKE_WIDTH}" stroke-linejoin="round"/>`,
    )
    .join('');
  return `<g transform="translate(${x.toFixed(2)} ${y.toFixed(2)}) scale(${scale.toFixed(4)})">${paths}</g>`;
}

/** The subset of pdfkit's document API the glyphs need (keeps this file free of pdfkit). */
export interface PdfPathPainter {
  save(): this;
  restore(): this;
  translate(x: number, y: number): this;
  scale(factor: number): this;
  path(d: string): this;
  lineWidth(width: number): this;
  lineJoin(join: 'round'): this;
  fill(colour: string): this;
  stroke(colour: string): this;
}

export function drawGlyphPdf(doc: PdfPathPainter, code: string, x: number, y: number, sizePt: number): void {
  const glyph = glyphFor(code);
  doc.save().translate(x, y).scale(sizePt / GLYPH_BOX);
  for (const part of glyph.parts) {
    doc.path(part.d);
    if (part.paint === 'fill') doc.fill(glyph.colourHex);
    else doc.lineWidth(STROKE_WIDTH).lineJoin('round').stroke(glyph.colourHex);
  }
  doc.restore();
}
