import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import { makePreviews, type PreviewSourceKind } from '../../worker/lib/previews';

// Outside checks: output sizes are read back with exiftool (`-j -n`), compared with Debian's
// vipsthumbnail and ImageMagick's `convert -auto-orient` run on the same sources.

const workDir = mkdtempSync(join(tmpdir(), 'lamella-previews-'));
afterAll(() => rmSync(workDir, { recursive: true, force: true }));
let counter = 0;
const path = (name: string) => join(workDir, `${(counter += 1)}-${name}`);

function exifSize(file: string): { width: number; height: number } {
  const [info] = JSON.parse(execFileSync('exiftool', ['-j', '-n', '-ImageWidth', '-ImageHeight', file]).toString());
  return { width: info.ImageWidth, height: info.ImageHeight };
}

// Four coloured quadrants, so any wrong rotation or mirror shows.
function quadrants(widthPx: number, heightPx: number) {
  const w = Math.round(widthPx / 2);
  const h = Math.round(heightPx / 2);
  const block = (background: string, left: number, top: number) => ({
    input: { create: { width: w, height: h, channels: 3 as const, background } },
    left,
    top,
  });
  return sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: '#000000' } }).composite([
    block('#D03030', 0, 0),
    block('#3050D0', widthPx - w, 0),
    block('#30B050', 0, heightPx - h),
    block('#E0D040', widthPx - w, heightPx - h),
  ]);
}

async function jpegFile(widthPx: number, heightPx: number, orientation?: number): Promise<string> {
  const file = path('src.jpg');
  await quadrants(widthPx, heightPx).jpeg({ quality: 90 }).toFile(file);
  if (orientation) execFileSync('exiftool', ['-q', '-overwrite_original', `-Orientation#=${orientation}`, file]);
  return file;
}

async function run(source: string, kind: PreviewSourceKind) {
  const dir = mkdtempSync(join(workDir, 'out-'));
  const outSmallPath = join(dir, 'small.jpg');
  const outLargePath = join(dir, 'large.jpg');
  const result = await makePreviews(source, { kind, outSmallPath, outLargePath });
  return { result, dir, outSmallPath, outLargePath };
}

/** Mean absolute difference (0–255) of two pictures brought to the same tiny size. */
async function pictureDistance(a: string, b: string): Promise<number> {
  const tiny = (file: string) => sharp(file).resize(16, 16, { fit: 'fill' }).removeAlpha().raw().toBuffer();
  const [x, y] = await Promise.all([tiny(a), tiny(b)]);
  return x.reduce((sum, value, i) => sum + Math.abs(value - y[i]), 0) / x.length;
}

// A small "RAW": a TIFF thumbnail page, then a full JPEG preview, then sensor-like data that
// holds a lossless-JPEG header (SOF3) which must not be mistaken for a picture.
function tiffRawFile(thumbnailTiff: string, previewJpeg: string): string {
  const sensorData = Buffer.concat([randomBytes(300_000), Buffer.from([0xff, 0xd8, 0xff, 0xc3, 0, 11, 8, 0x10, 0, 0x10, 0, 1]), randomBytes(300_000)]);
  const file = path('frame.dng');
  writeFileSync(file, Buffer.concat([readFileSync(thumbnailTiff), readFileSync(previewJpeg), sensorData]));
  return file;
}

function pngWithDeclaredSize(widthPx: number, heightPx: number): string {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const out = Buffer.alloc(body.length + 8);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body) >>> 0, body.length + 4);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(widthPx, 0);
  ihdr.writeUInt32BE(heightPx, 4);
  ihdr.set([8, 2, 0, 0, 0], 8); // 8-bit RGB (PNG spec §11.2.2)
  const file = path('huge.png');
  writeFileSync(file, Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', Buffer.from([0x78, 0x9c, 0x03, 0, 0, 0, 0, 1])), chunk('IEND', Buffer.alloc(0))]));
  return file;
}

describe('makePreviews', { timeout: 30_000 }, () => {
  it('makes a 1600 px and a 320 px JPEG of the sizes vipsthumbnail makes, via temp files only', async () => {
    const source = await jpegFile(2400, 1600);
    const { result, dir, outSmallPath, outLargePath } = await run(source, 'jpeg');
    expect(result).toMatchObject({ source: 'image', flags: [] });
    for (const [out, size] of [[outLargePath, 1600], [outSmallPath, 320]] as const) {
      const reference = path(`ref-${size}.jpg`);
      execFileSync('/usr/bin/vipsthumbnail', [source, '-s', String(size), '-o', reference]);
      expect(exifSize(out)).toEqual(exifSize(reference));
      expect(await pictureDistance(out, reference)).toBeLessThan(4);
    }
    expect(exifSize(outLargePath)).toEqual({ width: result.widthPx, height: result.heightPx });
    expect(readdirSync(dir).sort()).toEqual(['large.jpg', 'small.jpg']);
  });

  it('applies EXIF orientation 6 the way ImageMagick -auto-orient does: a portrait preview', async () => {
    const source = await jpegFile(1800, 1200, 6);
    const { result, outLargePath } = await run(source, 'jpeg');
    const { width, height } = exifSize(outLargePath);
    expect(height).toBeGreaterThan(width);
    const reference = path('ref.png');
    execFileSync('convert', [source, '-auto-orient', '-resize', '200x200', reference]);
    expect(await pictureDistance(outLargePath, reference)).toBeLessThan(6);
    expect(result.heightPx).toBe(1600);
  });

  it('takes the larger embedded preview of a TIFF-based RAW over its thumbnail page, honouring the container orientation', async () => {
    const orientations = [3, 5, 6, 8];
    const preview = path('preview.jpg');
    await quadrants(1500, 1000).jpeg({ quality: 85 }).toFile(preview);
    const thumb = path('thumb.tif');
    await quadrants(160, 106).tiff().toFile(thumb);
    const fixtures = orientations.map((orientation) => {
      const thumbCopy = path('thumb.tif');
      const tagged = path('tagged.jpg');
      writeFileSync(thumbCopy, readFileSync(thumb));
      writeFileSync(tagged, readFileSync(preview));
      return { orientation, thumbCopy, tagged };
    });
    // One exiftool process tags every RAW's thumbnail page and its reference copy of the preview.
    const args = fixtures.flatMap((f, i) => [...(i ? ['-execute'] : []), '-q', '-overwrite_original', `-Orientation#=${f.orientation}`, f.thumbCopy, f.tagged]);
    execFileSync('exiftool', args);

    for (const { orientation, thumbCopy, tagged } of fixtures) {
      const raw = tiffRawFile(thumbCopy, preview);
      expect(JSON.parse(execFileSync('exiftool', ['-j', '-n', '-Orientation', raw]).toString())[0].Orientation).toBe(orientation);
      const { result, outLargePath } = await run(raw, 'dng');
      expect(result.source).toBe('embedded-preview');
      // Reference: the same preview tagged with the RAW's orientation, turned by ImageMagick.
      const reference = path('ref.png');
      execFileSync('convert', [tagged, '-auto-orient', '-resize', '200x200', reference]);
      expect(exifSize(outLargePath), `orientation ${orientation}`).toEqual(orientation >= 5 ? { width: 1000, height: 1500 } : { width: 1500, height: 1000 });
      expect(await pictureDistance(outLargePath, reference), `orientation ${orientation}`).toBeLessThan(6);
    }
  }, 30_000);

  it('finds the largest JPEG in an ISO-BMFF RAW and ignores the small thumbnail', async () => {
    const box = (type: string, payload: Buffer) => {
      const head = Buffer.alloc(8);
      head.writeUInt32BE(payload.length + 8, 0);
      head.write(type, 4, 'ascii');
      return Buffer.concat([head, payload]);
    };
    const thumb = await quadrants(160, 120).jpeg().toBuffer();
    const preview = await quadrants(1620, 1080).jpeg().toBuffer();
    const raw = path('frame.bmff');
    writeFileSync(raw, Buffer.concat([box('ftyp', Buffer.from('lmla\0\0\0\0lmla', 'ascii')), box('uuid', Buffer.concat([randomBytes(16), thumb, preview])), box('mdat', randomBytes(500_000))]));
    const { result, outLargePath, outSmallPath } = await run(raw, 'bmff-raw');
    expect(result.source).toBe('embedded-preview');
    expect(exifSize(outLargePath)).toEqual({ width: 1600, height: 1067 });
    expect(exifSize(outSmallPath)).toEqual({ width: 320, height: 213 });
  });

  it('uses a plain TIFF itself when it decodes at full size', async () => {
    const tiff = path('scan.tif');
    await quadrants(2000, 1400).tiff().toFile(tiff);
    const { result, outLargePath } = await run(tiff, 'tiff-raw');
    expect(result.source).toBe('image');
    expect(exifSize(outLargePath)).toEqual({ width: 1600, height: 1120 });
  });

  it('turns a 30,000 × 30,000 header into a placeholder flagged too-large, without decoding it', async () => {
    const png = pngWithDeclaredSize(30_000, 30_000);
    expect(exifSize(png)).toEqual({ width: 30_000, height: 30_000 });
    const jpeg = Buffer.from(readFileSync(await jpegFile(64, 64)));
    const sof = jpeg.indexOf(Buffer.from([0xff, 0xc0]));
    jpeg.writeUInt16BE(30_000, sof + 5);
    jpeg.writeUInt16BE(30_000, sof + 7);
    const hugeJpeg = path('huge.jpg');
    writeFileSync(hugeJpeg, jpeg);
    expect(exifSize(hugeJpeg)).toEqual({ width: 30_000, height: 30_000 });

    for (const [file, kind] of [[png, 'png'], [hugeJpeg, 'jpeg']] as const) {
      const before = process.memoryUsage().rss;
      const { result, outLargePath, outSmallPath } = await run(file, kind);
      expect(result.source).toBe('placeholder');
      expect(result.flags).toEqual(['no-preview', 'too-large']);
      expect(exifSize(outLargePath)).toEqual({ width: 1600, height: 1067 });
      expect(exifSize(outSmallPath)).toEqual({ width: 320, height: 213 });
      // 30k × 30k RGB would be 2.7 GB decoded.
      expect(process.memoryUsage().rss - before).toBeLessThan(500 * 2 ** 20);
    }
  });

  it('writes a neutral grey placeholder for an undecodable file and an unsupported HEIF', async () => {
    const junk = path('broken.jpg');
    writeFileSync(junk, randomBytes(50_000));
    for (const kind of ['jpeg', 'heif'] as const) {
      const { result, outLargePath } = await run(junk, kind);
      expect(result).toMatchObject({ source: 'placeholder', flags: ['no-preview'] });
      // Mean colour by ImageMagick, close to the rule grey #D9D4CA (217, 212, 202).
      const mean = execFileSync('convert', [outLargePath, '-resize', '1x1!', '-format', '%[fx:int(255*r)],%[fx:int(255*g)],%[fx:int(255*b)]', 'info:']).toString().split(',').map(Number);
      [217, 212, 202].forEach((expected, i) => expect(Math.abs(mean[i] - expected)).toBeLessThan(12));
    }
  });

  it('rejects a missing source with a clear error and writes nothing', async () => {
    const dir = mkdtempSync(join(workDir, 'missing-'));
    await expect(
      makePreviews(join(dir, 'gone.jpg'), { kind: 'jpeg', outSmallPath: join(dir, 's.jpg'), outLargePath: join(dir, 'l.jpg') }),
    ).rejects.toThrow(/preview source cannot be read.*gone\.jpg.*ENOENT/);
    expect(readdirSync(dir)).toEqual([]);
    expect(existsSync(join(dir, 'l.jpg'))).toBe(false);
  });
});
