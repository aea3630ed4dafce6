import { createRequire } from 'node:module';
import { pipeline } from 'node:stream/promises';
import PDFDocument from 'pdfkit';
import sharp from 'sharp';
import { createAtomicWriteStream } from './atomic-file';
import {
  captionLines,
  headerLines,
  legendCodes,
  parseContactSheetInput,
  type ContactSheetFrame,
  type ContactSheetInput,
} from './contact-sheet-layout';
import { drawGlyphPdf, glyphFor } from './glyph-draw';

export interface ContactSheetPdfResult {
  pages: number;
  missingPreviewNumbers: number[];
}

const require = createRequire(import.meta.url);
const PLEX_REGULAR = require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff');
const PLEX_SEMIBOLD = require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff');

const INK = '#1F2A30';
const SLATE = '#5B6B73';
const RULE = '#D9D4CA';
export const PDF_COLUMNS = 4;
export const PDF_ROWS = 6;
export const FRAMES_PER_PAGE = PDF_COLUMNS * PDF_ROWS;

// A4 portrait in PostScript points (ISO 216: 210 × 297 mm).
const PAGE = { width: 595.28, height: 841.89, margin: 36 };
const HEADER_PT = 58;
const FOOTER_PT = 26;
const GRID = {
  top: PAGE.margin + HEADER_PT,
  cellW: (PAGE.width - 2 * PAGE.margin) / PDF_COLUMNS,
  cellH: (PAGE.height - 2 * PAGE.margin - HEADER_PT - FOOTER_PT) / PDF_ROWS,
};
const THUMB = { inset: 4, height: 84 };
const NUMBERS: PDFKit.Mixins.TextOptions = { lineBreak: false, features: ['tnum'] };

async function thumbnailJpeg(path: string): Promise<Buffer | null> {
  try {
    return await sharp(path, { limitInputPixels: 50_000_000, failOn: 'error' })
      .autoOrient()
      .resize(360, 360, { fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#FFFFFF' })
      .jpeg({ quality: 85 })
      .toBuffer();
  } catch {
    return null;
  }
}

function drawHeader(doc: PDFKit.PDFDocument, input: ContactSheetInput, page: number, pages: number): void {
  const { title, subtitle, counts } = headerLines(input.header);
  const { margin } = PAGE;
  const width = PAGE.width - 2 * margin;
  const pageLabel = `page ${page}/${pages}`;
  doc.font('semibold').fontSize(9).fillColor(SLATE).text(pageLabel, margin, margin + 3, { ...NUMBERS, width, align: 'right' });
  doc.font('semibold').fontSize(15).fillColor(INK).text(title, margin, margin, { lineBreak: false, width: width - 80, ellipsis: true });
  doc.font('regular').fontSize(10).fillColor(INK).text(subtitle, margin, margin + 21, { lineBreak: false, width, ellipsis: true });
  doc.font('regular').fontSize(8.5).fillColor(SLATE).text(counts, margin, margin + 36, { ...NUMBERS, width });
  doc.rect(margin, margin + HEADER_PT - 6, width, 0.8).fill(RULE);
}

function drawLegend(doc: PDFKit.PDFDocument, codes: string[]): void {
  const { margin } = PAGE;
  const y = PAGE.height - margin - FOOTER_PT + 10;
  doc.rect(margin, y - 8, PAGE.width - 2 * margin, 0.8).fill(RULE);
  let x = margin;
  for (const code of codes) {
    const { label } = glyphFor(code);
    drawGlyphPdf(doc, code, x, y + 2, 9);
    doc.font('regular').fontSize(8).fillColor(SLATE).text(label, x + 12, y + 1.5, { lineBreak: false });
    x += 12 + doc.widthOfString(label) + 14;
  }
}

function drawCell(doc: PDFKit.PDFDocument, frame: ContactSheetFrame, thumb: Buffer | null, x: number, y: number): void {
  const boxW = GRID.cellW - 2 * THUMB.inset;
  const boxX = x + THUMB.inset;
  const boxY = y + THUMB.inset;
  if (thumb) {
    doc.image(thumb, boxX, boxY, { fit: [boxW, THUMB.height], align: 'center', valign: 'center' });
  } else {
    doc.rect(boxX, boxY, boxW, THUMB.height).fill(RULE);
  }
  const { numberText, timeText, settingsText } = captionLines(frame);
  const line1 = boxY + THUMB.height + 4;
  doc.font('semibold').fontSize(8.5).fillColor(INK).text(numberText, boxX, line1, NUMBERS);
  doc.font('regular').fontSize(7.5).fillColor(SLATE).text(timeText, boxX + 24, line1 + 0.8, NUMBERS);
  doc.font('regular').fontSize(7.5).fillColor(INK).text(settingsText, boxX, line1 + 11, NUMBERS);
  frame.checkCodes.forEach((code, i) => drawGlyphPdf(doc, code, boxX + boxW - (i + 1) * 11, line1 + 0.5, 9));
}

/**
 * An A4 contact sheet, 4 × 6 frames a page, IBM Plex Sans embedded, with the header, the page
 * number and the glyph legend on every page. Written to a temporary file and renamed.
 */
export async function renderContactSheetPdf(input: ContactSheetInput, outPath: string): Promise<ContactSheetPdfResult> {
  const data = parseContactSheetInput(input);
  const pages = Math.max(1, Math.ceil(data.frames.length / FRAMES_PER_PAGE));
  const legend = legendCodes(data.frames);
  const missingPreviewNumbers: number[] = [];

  const doc = new PDFDocument({
    size: 'A4',
    margin: 0,
    autoFirstPage: false,
    font: PLEX_REGULAR,
    info: { Title: `${data.header.stackName} — contact sheet`, Creator: 'Lamella' },
  });
  doc.registerFont('regular', PLEX_REGULAR);
  doc.registerFont('semibold', PLEX_SEMIBOLD);
  const out = createAtomicWriteStream(outPath);
  const piping = pipeline(doc, out.stream);
  piping.catch(() => undefined);

  try {
    for (let page = 1; page <= pages; page += 1) {
      doc.addPage();
      drawHeader(doc, data, page, pages);
      drawLegend(doc, legend);
      const onPage = data.frames.slice((page - 1) * FRAMES_PER_PAGE, page * FRAMES_PER_PAGE);
      for (const [index, frame] of onPage.entries()) {
        const thumb = await thumbnailJpeg(frame.smallPreviewPath);
        if (!thumb) missingPreviewNumbers.push(frame.number);
        const x = PAGE.margin + (index % PDF_COLUMNS) * GRID.cellW;
        const y = GRID.top + Math.floor(index / PDF_COLUMNS) * GRID.cellH;
        drawCell(doc, frame, thumb, x, y);
      }
    }
    doc.end();
    await piping;
    await out.commit();
  } catch (error) {
    doc.destroy();
    await out.abort();
    throw error;
  }
  return { pages, missingPreviewNumbers };
}
