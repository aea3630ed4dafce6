// Outside checks for bundles and contact sheets with Debian's tools: Info-ZIP's unzip (integrity,
// entry list, extraction), poppler's pdfinfo (pages) and ImageMagick (size, pixel colours).
import crypto from 'node:crypto';
import fs from 'node:fs';
import { execFileSync } from 'node:child_process';
import type { Agent } from './api';

export const sha256Of = (data: Buffer) => crypto.createHash('sha256').update(data).digest('hex');
export const sha256File = (path: string) => sha256Of(fs.readFileSync(path));

/** GET as raw bytes (supertest buffers JSON and text only by default). */
export function getBinary(agent: Agent, url: string) {
  return agent.get(url).buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}

/** `unzip -t`: exits non-zero (and execFileSync throws) on any CRC or structure error. */
export function unzipTest(zipPath: string): string {
  return execFileSync('/usr/bin/unzip', ['-t', zipPath], { encoding: 'utf8' });
}

/** Entry names in the order of the zip's central directory (`zipinfo -1`). */
export function zipEntries(zipPath: string): string[] {
  return execFileSync('/usr/bin/unzip', ['-Z1', zipPath], { encoding: 'utf8' }).split('\n').filter(Boolean);
}

export function unzipTo(zipPath: string, dir: string): void {
  execFileSync('/usr/bin/unzip', ['-q', '-o', zipPath, '-d', dir]);
}

export function pdfPages(pdfPath: string): number {
  const out = execFileSync('/usr/bin/pdfinfo', [pdfPath], { encoding: 'utf8' });
  const m = /^Pages:\s+(\d+)/m.exec(out);
  if (!m) throw new Error(`pdfinfo gave no page count:\n${out}`);
  return Number(m[1]);
}

export function imageSize(path: string): { format: string; widthPx: number; heightPx: number } {
  const [format, w, h] = execFileSync('/usr/bin/identify', ['-format', '%m %w %h', path], { encoding: 'utf8' }).trim().split(' ');
  return { format, widthPx: Number(w), heightPx: Number(h) };
}

/** An image decoded by ImageMagick to 8-bit RGB, and the mean colour (0…255) of a box in it. */
export function decodedRgb(path: string): { widthPx: number; meanColour: (x: number, y: number, w: number, h: number) => { r: number; g: number; b: number } } {
  const { widthPx } = imageSize(path);
  const pixels = execFileSync('/usr/bin/convert', [path, '-depth', '8', 'rgb:-'], { maxBuffer: 1 << 30 });
  return {
    widthPx,
    meanColour(x, y, w, h) {
      const sum = [0, 0, 0];
      for (let row = y; row < y + h; row++) {
        for (let col = x; col < x + w; col++) for (let c = 0; c < 3; c++) sum[c] += pixels[(row * widthPx + col) * 3 + c];
      }
      const [r, g, b] = sum.map((v) => v / (w * h));
      return { r, g, b };
    },
  };
}
