// Grouping speed on a synthetic 10,000-frame card, against a plain sort of the same frames.
// Run: npx tsx bench/grouping.bench.ts
import { performance } from 'node:perf_hooks';
import { groupIntoStacks, type GroupingFrame } from '../shared/grouping';
import { pairRawAndJpeg, type CardFile } from '../shared/raw-pairing';
import { createRandom } from '../scripts/lib/stack-renderer/noise';

const FRAME_COUNT = 10_000;
const RUNS = 15;


function syntheticCard(count: number): GroupingFrame[] {
  const random = createRandom(42); // seeded: every run sees the same card
  const frames: GroupingFrame[] = [];
  const clocks = { 'BODY-A': Date.UTC(2025, 4, 17, 8), 'BODY-B': Date.UTC(2025, 4, 17, 8) };
  while (frames.length < count) {
    const body = random() < 0.7 ? 'BODY-A' : 'BODY-B';
    const handFocused = random() < 0.4;
    const size = 1 + Math.floor(random() * 60);
    const fNumber = [5.6, 8, 11][Math.floor(random() * 3)];
    clocks[body] += 60_000 + random() * 600_000;
    for (let i = 0; i < size && frames.length < count; i += 1) {
      clocks[body] += handFocused ? 5000 + random() * 15_000 : 200 + random() * 300;
      const n = frames.length;
      frames.push({
        id: `f${n}`,
        fileName: `FRN_${String(n % 10_000).padStart(4, '0')}.JPG`,
        captureTimeMs: random() < 0.01 ? null : Math.round(clocks[body]),
        bodySerial: body,
        fNumber,
        focalLengthMm: 100,
        exposureTimeS: random() < 0.05 ? 1 / 60 : 1 / 125,
        iso: 100,
        orientation: 1,
      });
    }
  }
  // A card lists files in folder order, not capture order: shuffle to make the sort work.
  for (let i = frames.length - 1; i > 0; i -= 1) {
    const j = Math.floor(random() * (i + 1));
    [frames[i], frames[j]] = [frames[j], frames[i]];
  }
  return frames;
}

function medianMs(run: () => unknown): number {
  for (let i = 0; i < 3; i += 1) run(); // warm-up for the JIT
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

const frames = syntheticCard(FRAME_COUNT);
const files: CardFile[] = frames.flatMap((f) => [
  { ...f, id: `${f.id}-raw`, fileName: f.fileName.replace('.JPG', '.RAW'), isRaw: true },
  { ...f, id: `${f.id}-jpg`, isRaw: false },
]);

const groupingMs = medianMs(() => groupIntoStacks(frames));
const pairingMs = medianMs(() => pairRawAndJpeg(files));
const sortMs = medianMs(() => [...frames].sort((a, b) => (a.captureTimeMs ?? Infinity) - (b.captureTimeMs ?? Infinity)));
const result = groupIntoStacks(frames);

console.log(`frames: ${FRAME_COUNT}, stacks: ${result.stacks.length}, loose frames: ${result.loose.length}`);
console.log(`groupIntoStacks median: ${groupingMs.toFixed(2)} ms over ${RUNS} runs`);
console.log(`pairRawAndJpeg (${files.length} files) median: ${pairingMs.toFixed(2)} ms`);
console.log(`reference Array.prototype.sort by capture time: ${sortMs.toFixed(2)} ms`);
console.log(`ratio grouping / plain sort: ${(groupingMs / sortMs).toFixed(1)}×`);
