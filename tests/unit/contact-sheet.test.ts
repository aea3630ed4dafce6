import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renderContactSheetJpeg, renderContactSheetPdf, type ContactSheetInput } from '../../worker/lib/contact-sheet';
import { formatCaptureTime, formatExposureTime, formatFNumber } from '../../worker/lib/contact-sheet-layout';

// Outside checks: poppler's pdfinfo / pdffonts / pdftotext read the PDFs; exiftool reads the
// JPEG's size and ImageMagick samples every cell of its grid.

const workDir = mkdtempSync(join(tmpdir(), 'lamella-sheet-'));
afterAll(() => rmSync(workDir, { recursive: true, force: true }));

// Each frame's preview is one flat colour, so a cell shows which frame it holds.
const colourOf = (n: number) => ({ r: (n * 53) % 200 + 30, g: (n * 97) % 200 + 30, b: (n * 31) % 200 + 30 });
const previews: string[] = [];
beforeAll(async () => {
  for (let n = 1; n <= 30; n += 1) {
    const file = join(workDir, `preview-${n}.jpg`);
    const portrait = n % 7 === 0;
    await sharp({ create: { width: portrait ? 213 : 320, height: portrait ? 320 : 213, channels: 3, background: colourOf(n) } })
      .jpeg({ quality: 95 })
      .toFile(file);
    previews.push(file);
  }
});

function sheetInput(frameCount: number, missing: number[] = []): ContactSheetInput {
  return {
    header: { sessionTitle: 'Watch movement, balance wheel', stackName: 'Balance 3x', planName: 'Balance 3x f/5.6', frameCount: frameCount + 2, excludedCount: 2, flaggedCount: 2 },
    frames: Array.from({ length: frameCount }, (_, i) => ({
      number: i + 1,
      smallPreviewPath: missing.includes(i + 1) ? join(workDir, 'gone.jpg') : previews[i],
      captureTimeIso: `2026-06-11T10:04:${String(i + 10).padStart(2, '0')}.4+02:00`,
      exposureTimeS: 1 / 125,
      fNumber: 5.6,
      iso: 100,
      checkCodes: i === 4 ? ['exposure-jump'] : i === 9 ? ['focus-gap', 'duplicate-frame'] : [],
    })),
  };
}

const pdfPages = (file: string) => Number(/Pages:\s+(\d+)/.exec(execFileSync('/usr/bin/pdfinfo', [file]).toString())![1]);

describe('renderContactSheetJpeg', { timeout: 30_000 }, () => {
  it('lays out one cell per frame, in order, at the size it reports', async () => {
    const outPath = join(workDir, 'sheet.jpg');
    const result = await renderContactSheetJpeg(sheetInput(27, [13]), outPath);
    const [meta] = JSON.parse(execFileSync('exiftool', ['-j', '-n', '-ImageWidth', '-ImageHeight', outPath]).toString());
    expect({ width: meta.ImageWidth, height: meta.ImageHeight }).toEqual({ width: result.widthPx, height: result.heightPx });
    expect(result.widthPx).toBe(result.columns * result.cellWidthPx);
    expect(result.heightPx).toBe(result.headerHeightPx + result.rows * result.cellHeightPx);
    expect(result.rows * result.columns).toBeGreaterThanOrEqual(27);
    expect(result.missingPreviewNumbers).toEqual([13]);

    // ImageMagick tiles the grid (header chopped off) and reads each cell's thumbnail centre,
    // plus the darkest value of its caption strip (text rendered there).
    const cx = Math.round(result.cellWidthPx / 2);
    const cy = Math.round(result.cellHeightPx * 0.4);
    const cap = `${result.cellWidthPx - 30}x${Math.round(result.cellHeightPx * 0.18)}+15+${Math.round(result.cellHeightPx * 0.8)}`;
    const tiles = execFileSync('convert', [
      outPath, '-chop', `0x${result.headerHeightPx}`, '-crop', `${result.cellWidthPx}x${result.cellHeightPx}`,
      '-format', `%[fx:int(255*p{${cx},${cy}}.r)] %[fx:int(255*p{${cx},${cy}}.g)] %[fx:int(255*p{${cx},${cy}}.b)]\n`, 'info:',
    ]).toString().trim().split('\n').map((line) => line.split(' ').map(Number));
    const captionDarkness = execFileSync('convert', [
      outPath, '-chop', `0x${result.headerHeightPx}`, '-crop', `${result.cellWidthPx}x${result.cellHeightPx}`,
      '+repage', '-crop', cap, '-format', '%[fx:minima.intensity]\n', 'info:',
    ]).toString().trim().split('\n').map(Number);
    expect(tiles).toHaveLength(result.rows * result.columns);
    tiles.forEach(([r, g, b], index) => {
      const n = index + 1;
      const expected = n > 27 ? { r: 246, g: 244, b: 239 } : n === 13 ? { r: 217, g: 212, b: 202 } : colourOf(n);
      expect(Math.abs(r - expected.r) + Math.abs(g - expected.g) + Math.abs(b - expected.b), `cell ${n}`).toBeLessThan(20);
      if (n <= 27) expect(captionDarkness[index], `caption of cell ${n}`).toBeLessThan(0.4);
      else expect(captionDarkness[index], `empty cell ${n}`).toBeGreaterThan(0.9);
    });
    const headerDarkness = Number(execFileSync('convert', [outPath, '-crop', `${result.widthPx}x${result.headerHeightPx}+0+0`, '-format', '%[fx:minima.intensity]', 'info:']).toString());
    expect(headerDarkness).toBeLessThan(0.3);
  });

  it('draws a header-only sheet for an empty stack and refuses bad input clearly', async () => {
    const empty = await renderContactSheetJpeg(sheetInput(0), join(workDir, 'empty.jpg'));
    expect(empty.rows).toBe(0);
    expect(empty.heightPx).toBe(empty.headerHeightPx);
    const bad = sheetInput(3);
    bad.header.frameCount = -1;
    await expect(renderContactSheetJpeg(bad, join(workDir, 'bad.jpg'))).rejects.toThrow(/frameCount/);
  });
});

describe('renderContactSheetPdf', { timeout: 30_000 }, () => {
  it('puts 4 × 6 frames on an A4 page with IBM Plex Sans embedded', async () => {
    for (const [frames, pages] of [[24, 1], [25, 2], [0, 1]] as const) {
      const outPath = join(workDir, `sheet-${frames}.pdf`);
      const result = await renderContactSheetPdf(sheetInput(frames), outPath);
      expect(result.pages).toBe(pages);
      expect(pdfPages(outPath), `${frames} frames`).toBe(pages);
    }
    const file = join(workDir, 'sheet-25.pdf');
    expect(execFileSync('/usr/bin/pdfinfo', [file]).toString()).toMatch(/Page size:\s+595\.2\d? x 841\.89 pts \(A4\)/);
    const fonts = execFileSync('/usr/bin/pdffonts', [file]).toString().trim().split('\n').slice(2);
    expect(fonts.length).toBeGreaterThanOrEqual(2);
    for (const line of fonts) {
      expect(line).toMatch(/IBMPlexSans-(Regular|SemiBold)/);
      // columns: name type… encoding emb sub uni
      expect(line.split(/\s+/).slice(-5, -2)).toEqual(['yes', 'yes', 'yes']);
    }
  });

  it('prints the header with page x/y, captions and the glyph legend on every page', async () => {
    const file = join(workDir, 'sheet-30.pdf');
    expect((await renderContactSheetPdf(sheetInput(30), file)).pages).toBe(2);
    expect(pdfPages(file)).toBe(2);
    const pages = execFileSync('/usr/bin/pdftotext', ['-layout', file, '-']).toString().split('\f');
    for (const [index, text] of pages.slice(0, 2).entries()) {
      expect(text).toContain('Watch movement, balance wheel');
      expect(text).toContain('Balance 3x · plan: Balance 3x f/5.6');
      expect(text).toContain(`page ${index + 1}/2`);
      for (const label of ['Exposure jump', 'Focus gap', 'Duplicate frame', 'Plan mismatch', 'Setting change']) expect(text).toContain(label);
    }
    expect(pages[0]).toContain('1/125 s');
    expect(pages[0]).toContain('10:04:10.40');
    expect(pages[1]).toMatch(/\b30\b/);
    expect(pages[1]).not.toMatch(/\b24\s+10:04/);
  });

  it('keeps a missing preview as a grey cell and leaves no file when the folder is missing', async () => {
    const result = await renderContactSheetPdf(sheetInput(5, [2]), join(workDir, 'gap.pdf'));
    expect(result.missingPreviewNumbers).toEqual([2]);
    const dir = mkdtempSync(join(workDir, 'nofolder-'));
    await expect(renderContactSheetPdf(sheetInput(3), join(dir, 'missing', 'x.pdf'))).rejects.toThrow(/ENOENT/);
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('caption formatting', () => {
  it('writes exposure, aperture and time as photographers read them', () => {
    // common practice: reciprocal seconds below about 0.3 s, decimals above
    expect(formatExposureTime(1 / 125)).toBe('1/125 s');
    expect(formatExposureTime(1 / 4000)).toBe('1/4000 s');
    expect(formatExposureTime(0.5)).toBe('0.5 s');
    expect(formatExposureTime(30)).toBe('30 s');
    expect(formatFNumber(5.6)).toBe('f/5.6');
    expect(formatFNumber(8)).toBe('f/8');
    // the camera's wall-clock time as written, whatever the server's zone
    expect(formatCaptureTime('2026-06-11T23:59:59.987-07:00')).toBe('23:59:59.98');
    expect(formatCaptureTime('2026-06-11T08:00:00Z')).toBe('08:00:00');
    expect(formatCaptureTime(null)).toBe('time unknown');
  });
});
