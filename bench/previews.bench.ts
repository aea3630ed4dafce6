// Preview speed: Lamella's preview pair (1600 px + 320 px JPEG) against Debian's vipsthumbnail
// making the same two sizes from the same 24-megapixel (6000 × 4000) JPEGs.
// Run: npx tsx bench/previews.bench.ts   (PREVIEW_BENCH_FILES=4, PREVIEW_BENCH_RUNS=3)
import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { promisify } from 'node:util';
import sharp from 'sharp';
import { LARGE_PREVIEW_LONG_EDGE_PX, makePreviews, SMALL_PREVIEW_LONG_EDGE_PX } from '../worker/lib/previews';

const FILE_COUNT = Number(process.env.PREVIEW_BENCH_FILES ?? 4);
const RUNS = Number(process.env.PREVIEW_BENCH_RUNS ?? 3);
const VIPSTHUMBNAIL = '/usr/bin/vipsthumbnail';
const run = promisify(execFile);

async function makeSources(dir: string): Promise<string[]> {
  const paths: string[] = [];
  for (let i = 0; i < FILE_COUNT; i += 1) {
    const path = join(dir, `FERN_${String(i + 1).padStart(4, '0')}.jpg`);
    // Blurred noise: detail like a real photograph, so the JPEG decoder does real work (~6–9 MB files).
    await sharp({ create: { width: 6000, height: 4000, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128 + i, sigma: 40 } } })
      .blur(0.8)
      .jpeg({ quality: 90 })
      .toFile(path);
    paths.push(path);
  }
  return paths;
}

async function lamella(paths: string[], outDir: string): Promise<number> {
  const start = performance.now();
  for (const [i, path] of paths.entries()) {
    await makePreviews(path, { kind: 'jpeg', outSmallPath: join(outDir, `s${i}.jpg`), outLargePath: join(outDir, `l${i}.jpg`) });
  }
  return performance.now() - start;
}

async function reference(paths: string[], outDir: string): Promise<number> {
  const start = performance.now();
  // One process per size for all files, so process start-up is paid twice, not per file.
  await run(VIPSTHUMBNAIL, ['-s', String(LARGE_PREVIEW_LONG_EDGE_PX), '-o', join(outDir, 'vl-%s.jpg[Q=82]'), ...paths]);
  await run(VIPSTHUMBNAIL, ['-s', String(SMALL_PREVIEW_LONG_EDGE_PX), '-o', join(outDir, 'vs-%s.jpg[Q=80]'), ...paths]);
  return performance.now() - start;
}

async function main(): Promise<void> {
  const dir = await mkdtemp(join(tmpdir(), 'lamella-bench-previews-'));
  try {
    console.log(`making ${FILE_COUNT} JPEGs of 6000 × 4000 px …`);
    const paths = await makeSources(dir);
    await lamella(paths.slice(0, 1), dir); // warm-up: libvips start, page cache
    await reference(paths.slice(0, 1), dir);
    let bestLamella = Infinity;
    let bestReference = Infinity;
    for (let r = 0; r < RUNS; r += 1) {
      bestLamella = Math.min(bestLamella, await lamella(paths, dir));
      bestReference = Math.min(bestReference, await reference(paths, dir));
    }
    const perFile = (ms: number) => (ms / paths.length).toFixed(1);
    console.log(`Lamella makePreviews (pair):  ${perFile(bestLamella)} ms/file`);
    console.log(`vipsthumbnail (both sizes):   ${perFile(bestReference)} ms/file`);
    console.log(`ratio Lamella / vipsthumbnail: ${(bestLamella / bestReference).toFixed(2)}  (best of ${RUNS} runs, ${paths.length} files)`);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

await main();
