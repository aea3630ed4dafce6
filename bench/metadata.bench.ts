// Metadata reading speed: Lamella's reader against `exiftool -fast2 -j` on the same ~200 files.
// Run: npx tsx bench/metadata.bench.ts
import { execFile } from 'node:child_process';
import { copyFile, mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { promisify } from 'node:util';
import { readCaptureMetadata } from '../server/lib/metadata';
import { EXIFTOOL, makeJpeg, makeTiff, writeTagsToMany, type TagValues } from '../tests/helpers/exiftool';

const FILE_COUNT = 200;
const TIFF_SHARE = 0.2;
const RUNS = 5;
const CONCURRENCY = 8;
const run = promisify(execFile);

async function makeCard(dir: string): Promise<string[]> {
  const paths: string[] = [];
  const entries: { path: string; tags: TagValues }[] = [];
  // Noise, so files have the size of real pictures and a reader that reads too much shows it.
  const picture = { widthPx: 1000, heightPx: 667, noise: true };
  const jpegTemplate = join(dir, 'template.jpg');
  const tiffTemplate = join(dir, 'template.tif');
  await makeJpeg(jpegTemplate, picture);
  await makeTiff(tiffTemplate, picture);
  const startMs = Date.UTC(2025, 4, 17, 9, 0, 0);
  for (let i = 0; i < FILE_COUNT; i += 1) {
    const isTiff = i < FILE_COUNT * TIFF_SHARE;
    const path = join(dir, `FRN_${String(i + 1).padStart(4, '0')}.${isTiff ? 'TIF' : 'JPG'}`);
    await copyFile(isTiff ? tiffTemplate : jpegTemplate, path);
    const timeMs = startMs + i * 7_300;
    const date = new Date(timeMs).toISOString();
    entries.push({
      path,
      tags: {
        DateTimeOriginal: `${date.slice(0, 10).replace(/-/g, ':')} ${date.slice(11, 19)}`,
        SubSecTimeOriginal: date.slice(20, 23),
        OffsetTimeOriginal: '+02:00',
        ExposureTime: 0.008, FNumber: 8, ISO: 100, FocalLength: 100, Orientation: 1,
        SerialNumber: 'STUDIO-BODY-0042', ExifImageWidth: picture.widthPx, ExifImageHeight: picture.heightPx,
      },
    });
    paths.push(path);
  }
  await writeTagsToMany(entries);
  return paths;
}

async function readAllWithLamella(paths: string[], concurrency: number): Promise<void> {
  let next = 0;
  const worker = async () => {
    while (next < paths.length) {
      const path = paths[next++];
      const result = await readCaptureMetadata(path, { fileName: path, fileMtimeMs: null });
      if (result.captureTimeSource !== 'exif') throw new Error(`no capture time read from ${path}`);
    }
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}

async function readAllWithExiftool(paths: string[]): Promise<void> {
  const { stdout } = await run(EXIFTOOL, ['-fast2', '-j', ...paths], { maxBuffer: 64 * 1024 * 1024 });
  if ((JSON.parse(stdout) as unknown[]).length !== paths.length) throw new Error('exiftool skipped files');
}

async function medianMs(task: () => Promise<void>): Promise<number> {
  await task(); // warm-up: page cache, JIT, exiftool's module loading
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    await task();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

const filesPerSecond = (ms: number) => (FILE_COUNT / (ms / 1000)).toFixed(0);

const dir = await mkdtemp(join(tmpdir(), 'lamella-metadata-bench-'));
try {
  const paths = await makeCard(dir);
  let bytes = 0;
  for (const path of paths) bytes += (await stat(path)).size;
  console.log(`${FILE_COUNT} files (${Math.round(TIFF_SHARE * 100)} % TIFF), ${(bytes / 1e6).toFixed(1)} MB, median of ${RUNS} runs`);

  const sequentialMs = await medianMs(() => readAllWithLamella(paths, 1));
  const parallelMs = await medianMs(() => readAllWithLamella(paths, CONCURRENCY));
  const exiftoolMs = await medianMs(() => readAllWithExiftool(paths));
  const startUpMs = await medianMs(async () => void (await run(EXIFTOOL, ['-ver'])));
  console.log(`Lamella, one at a time:       ${filesPerSecond(sequentialMs)} files/s (${sequentialMs.toFixed(0)} ms)`);
  console.log(`Lamella, ${CONCURRENCY} at a time:         ${filesPerSecond(parallelMs)} files/s (${parallelMs.toFixed(0)} ms)`);
  console.log(`exiftool -fast2 -j (1 process): ${filesPerSecond(exiftoolMs)} files/s (${exiftoolMs.toFixed(0)} ms, Perl start-up included)`);
  console.log(`exiftool start-up alone (-ver): ${startUpMs.toFixed(0)} ms`);
  console.log(`ratio Lamella (one at a time) / exiftool: ${(exiftoolMs / sequentialMs).toFixed(1)}× the files per second`);
  console.log(`ratio Lamella (one at a time) / exiftool without its start-up: ${((exiftoolMs - startUpMs) / sequentialMs).toFixed(1)}×`);
  console.log(`ratio Lamella (${CONCURRENCY} at a time) / exiftool: ${(exiftoolMs / parallelMs).toFixed(1)}× the files per second`);
} finally {
  await rm(dir, { recursive: true, force: true });
}
