// Drawing of the check glyphs (shape carries the meaning as well as colour, PRODUCT.md "Look").
// Shapes are SVG path data in a 16 × 16 box so the JPEG (SVG via librsvg) and the PDF
// (pdfkit's SVG-path support) draw exactly the same figure.
// TODO: key the labels off CHECK_GLYPHS in shared/checks.ts once it lands.

export interface GlyphPart {
  d: string;
  paint: 'fill' | 'stroke';
}

export interface CheckGlyph {
  code: string;
  label: string;
  colourHex: string;
  shape: string;
  parts: GlyphPart[];
}

export const GLYPH_BOX = 16;
const STROKE_WIDTH = 1.8;
const INK = '#1F2A30';

export const CHECK_GLYPH_DRAWINGS: Record<string, CheckGlyph> = {
  'exposure-jump': {
    code: 'exposure-jump',
    label: 'Exposure jump',
    colourHex: '#B7791F',
    shape: 'half-filled circle',
    parts: [
      { d: 'M8 1.6 A6.4 6.4 0 1 1 8 14.4 A6.4 6.4 0 1 1 8 1.6 Z', paint: 'stroke' },
      { d: 'M8 1.6 A6.4 6.4 0 0 0 8 14.4 Z', paint: 'fill' },
    ],
  },
  'focus-gap': {
    code: 'focus-gap',
    label: 'Focus gap',
    colourHex: '#7B3F73',
    shape: 'bracket with a break',
    parts: [
      { d: 'M11.5 2 H4.5 V6.4', paint: 'stroke' },
      { d: 'M4.5 9.6 V14 H11.5', paint: 'stroke' },
    ],
  },
  'duplicate-frame': {
    code: 'duplicate-frame',
    label: 'Duplicate frame',
    colourHex: '#4A6FA5',
    shape: 'two stacked bars',
    parts: [
      { d: 'M2 3 H14 V6.6 H2 Z', paint: 'fill' },
      { d: 'M2 9.4 H14 V13 H2 Z', paint: 'fill' },
    ],
  },
  'plan-mismatch': {
    code: 'plan-mismatch',
    label: 'Plan mismatch',
    colourHex: '#A4452C',
    shape: 'hollow triangle',
    parts: [{ d: 'M8 2 L14.4 13.8 H1.6 Z', paint: 'stroke' }],
  },
  'setting-change': {
    code: 'setting-change',
    label: 'Setting change',
    colourHex: '#5B6B73',
    shape: 'small diamond',
    parts: [{ d: 'M8 3.5 L12.5 8 L8 12.5 L3.5 8 Z', paint: 'fill' }],
  },
};

export const KNOWN_CHECK_CODES = Object.keys(CHECK_GLYPH_DRAWINGS);

/** Any other flag (e.g. 'no-capture-time') gets a plain ring so it is still seen. */
export function glyphFor(code: string): CheckGlyph {
  return (
    CHECK_GLYPH_DRAWINGS[code] ?? {
      code,
      label: code.replace(/-/g, ' '),
      colourHex: INK,
      shape: 'ring',
      parts: [{ d: 'M8 3 A5 5 0 1 1 8 13 A5 5 0 1 1 8 3 Z', paint: 'stroke' }],
    }
  );
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
