import sharp, { type OutputInfo } from 'sharp';
import { writeFileAtomic } from './atomic-file';
import {
  captionLines,
  defaultColumns,
  escapeXml,
  headerLines,
  legendCodes,
  parseContactSheetInput,
  type ContactSheetFrame,
  type ContactSheetInput,
} from './contact-sheet-layout';
import { glyphFor, glyphSvg } from './glyph-draw';

export type { ContactSheetInput } from './contact-sheet-layout';
export { renderContactSheetPdf } from './contact-sheet-pdf';

export interface ContactSheetJpegResult {
  widthPx: number;
  heightPx: number;
  cellWidthPx: number;
  cellHeightPx: number;
  headerHeightPx: number;
  columns: number;
  rows: number;
  /** Frames whose small preview could not be read; their cells show a grey placeholder. */
  missingPreviewNumbers: number[];
}

const PAPER = '#F6F4EF';
const INK = '#1F2A30';
const SLATE = '#5B6B73';
const RULE = '#D9D4CA';
// librsvg resolves the family through fontconfig; Plex is not installed system-wide, so the
// JPEG normally falls back to the machine's sans (the PDF embeds Plex itself).
const FONT = "'IBM Plex Sans', 'DejaVu Sans', sans-serif";
/** Above this the cells shrink, so a 1,000-frame stack still makes a sheet of sane size. */
export const MAX_SHEET_PIXELS = 40_000_000;

// Cells wait in memory until libvips joins them: as JPEG a photographic cell is ~40 kB where PNG
// would be ~250 kB. No chroma subsampling keeps the coloured glyphs and small text crisp.
const CELL_JPEG = { quality: 92, chromaSubsampling: '4:4:4' } as const;

const BASE = { cellW: 344, cellH: 312, pad: 12, thumbW: 320, thumbH: 240, header: 150, glyph: 18 };
type Dims = typeof BASE;

function scaled(scale: number): Dims {
  const entries = Object.entries(BASE).map(([key, value]) => [key, Math.max(1, Math.round(value * scale))]);
  const d = Object.fromEntries(entries) as Dims;
  return { ...d, cellW: d.thumbW + 2 * d.pad }; // rounded separately they could differ by a pixel
}

function cellSvg(frame: ContactSheetFrame | null, d: Dims, missing: boolean): string {
  const s = d.cellW / BASE.cellW;
  const parts = [`<rect width="100%" height="100%" fill="${PAPER}"/>`];
  if (frame) {
    const { numberText, timeText, settingsText } = captionLines(frame);
    const line1 = d.pad + d.thumbH + 22 * s;
    const line2 = line1 + 22 * s;
    if (missing) {
      parts.push(`<rect x="${d.pad}" y="${d.pad}" width="${d.thumbW}" height="${d.thumbH}" fill="${RULE}"/>`);
      parts.push(`<line x1="${d.pad + d.thumbW * 0.4}" y1="${d.pad + d.thumbH * 0.6}" x2="${d.pad + d.thumbW * 0.6}" y2="${d.pad + d.thumbH * 0.4}" stroke="${SLATE}" stroke-width="${3 * s}"/>`);
    }
    parts.push(
      `<text x="${d.pad}" y="${line1}" font-family="${FONT}" font-size="${17 * s}" font-weight="bold" fill="${INK}">${escapeXml(numberText)}</text>`,
      `<text x="${d.pad + 52 * s}" y="${line1}" font-family="${FONT}" font-size="${14 * s}" fill="${SLATE}">${escapeXml(timeText)}</text>`,
      `<text x="${d.pad}" y="${line2}" font-family="${FONT}" font-size="${14 * s}" fill="${INK}">${escapeXml(settingsText)}</text>`,
    );
    frame.checkCodes.forEach((code, i) => {
      const x = d.pad + d.thumbW - (i + 1) * (d.glyph + 4 * s);
      parts.push(glyphSvg(code, x, line1 - d.glyph + 3 * s, d.glyph));
    });
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" xml:space="preserve" width="${d.cellW}" height="${d.cellH}">${parts.join('')}</svg>`;
}

async function renderCell(frame: ContactSheetFrame, d: Dims): Promise<{ cell: Buffer; missing: boolean }> {
  // A missing or broken preview must not cost the whole sheet: its cell shows a grey box.
  const thumb: { data: Buffer; info: OutputInfo } | null = await sharp(frame.smallPreviewPath, { limitInputPixels: 50_000_000, failOn: 'error' })
    .autoOrient()
    .resize(d.thumbW, d.thumbH, { fit: 'inside' })
    .flatten({ background: PAPER })
    .png({ compressionLevel: 1 })
    .toBuffer({ resolveWithObject: true })
    .catch(() => null);
  const base = sharp(Buffer.from(cellSvg(frame, d, !thumb)));
  const overlay = thumb
    ? [{ input: thumb.data, left: d.pad + Math.floor((d.thumbW - thumb.info.width) / 2), top: d.pad + Math.floor((d.thumbH - thumb.info.height) / 2) }]
    : [];
  return { cell: await base.composite(overlay).jpeg(CELL_JPEG).toBuffer(), missing: !thumb };
}

function headerSvg(input: ContactSheetInput, widthPx: number, d: Dims): string {
  const s = d.header / BASE.header;
  const { title, subtitle, counts } = headerLines(input.header);
  const legend = legendCodes(input.frames);
  let x = 16 * s;
  const legendParts = legend.map((code) => {
    const label = glyphFor(code).label;
    const part = `${glyphSvg(code, x, 116 * s, d.glyph)}<text x="${x + d.glyph + 6 * s}" y="${131 * s}" font-family="${FONT}" font-size="${14 * s}" fill="${SLATE}">${escapeXml(label)}</text>`;
    x += d.glyph + 6 * s + label.length * 8 * s + 24 * s;
    return part;
  });
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${d.header}">
<rect width="100%" height="100%" fill="${PAPER}"/>
<text x="${16 * s}" y="${40 * s}" font-family="${FONT}" font-size="${26 * s}" font-weight="bold" fill="${INK}">${escapeXml(title)}</text>
<text x="${16 * s}" y="${70 * s}" font-family="${FONT}" font-size="${18 * s}" fill="${INK}">${escapeXml(subtitle)}</text>
<text x="${16 * s}" y="${98 * s}" font-family="${FONT}" font-size="${15 * s}" fill="${SLATE}">${escapeXml(counts)}</text>
${legendParts.join('')}
<rect y="${d.header - Math.max(1, 2 * s)}" width="100%" height="${Math.max(1, 2 * s)}" fill="${RULE}"/>
</svg>`;
}

/**
 * One JPEG per stack: a header band, then a grid of cells (thumbnail, number, capture time,
 * exposure, check glyphs) in frame order. Big stacks get smaller cells so the sheet stays
 * within MAX_SHEET_PIXELS. A frame whose preview is missing gets a grey cell, not an error.
 */
export async function renderContactSheetJpeg(input: ContactSheetInput, outPath: string): Promise<ContactSheetJpegResult> {
  const data = parseContactSheetInput(input);
  const count = data.frames.length;
  const columns = data.columns ?? defaultColumns(count);
  const rows = Math.ceil(count / columns);
  const basePixels = columns * BASE.cellW * (rows * BASE.cellH + BASE.header);
  const d = scaled(Math.min(1, Math.sqrt(MAX_SHEET_PIXELS / basePixels)));
  const widthPx = columns * d.cellW;

  const cells: Buffer[] = [];
  const missingPreviewNumbers: number[] = [];
  for (const frame of data.frames) {
    const { cell, missing } = await renderCell(frame, d);
    cells.push(cell);
    if (missing) missingPreviewNumbers.push(frame.number);
  }
  if (rows * columns > count) {
    const blank = await sharp(Buffer.from(cellSvg(null, d, false))).jpeg(CELL_JPEG).toBuffer();
    while (cells.length < rows * columns) cells.push(blank);
  }

  // The sheet is put together as raw pixels, one band at a time (header, then each row of
  // cells joined by libvips), then encoded once: peak memory is the raw sheet, at most
  // MAX_SHEET_PIXELS × 3 bytes, however many frames there are.
  const heightPx = d.header + rows * d.cellH;
  const sheetPixels = Buffer.alloc(widthPx * heightPx * 3);
  const header = await sharp(Buffer.from(headerSvg(data, widthPx, d))).flatten({ background: PAPER }).removeAlpha().raw().toBuffer();
  header.copy(sheetPixels, 0);
  for (let row = 0; row < rows; row += 1) {
    const rowCells = cells.slice(row * columns, (row + 1) * columns);
    const band = await sharp(rowCells, { join: { across: columns } }).removeAlpha().raw().toBuffer();
    band.copy(sheetPixels, (d.header + row * d.cellH) * widthPx * 3);
  }
  const { data: jpeg, info } = await sharp(sheetPixels, { raw: { width: widthPx, height: heightPx, channels: 3 }, limitInputPixels: false })
    // Huffman optimisation keeps every coefficient of the sheet in memory (+200 MB at 40 MP).
    .jpeg({ quality: 85, optimizeCoding: false })
    .toBuffer({ resolveWithObject: true });
  await writeFileAtomic(outPath, jpeg);
  return {
    widthPx: info.width,
    heightPx: info.height,
    cellWidthPx: d.cellW,
    cellHeightPx: d.cellH,
    headerHeightPx: d.header,
    columns,
    rows,
    missingPreviewNumbers,
  };
}
