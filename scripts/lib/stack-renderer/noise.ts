/** Seeded randomness and value noise for the synthetic scenes: same seed, same pixels. */

/** mulberry32, a small public-domain 32-bit generator (Tommy Ettinger, 2017). */
export function createRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function randomBetween(random: () => number, low: number, high: number): number {
  return low + (high - low) * random();
}

function hash2(ix: number, iy: number, seed: number): number {
  let h = Math.imul(ix, 374761393) + Math.imul(iy, 668265263) + Math.imul(seed, 144664847);
  h = Math.imul(h ^ (h >>> 13), 1274126177);
  return ((h ^ (h >>> 16)) >>> 0) / 4294967296;
}

/** Value noise in [0, 1) on a unit lattice, smoothstep-interpolated. */
export function valueNoise(x: number, y: number, seed: number): number {
  const ix = Math.floor(x);
  const iy = Math.floor(y);
  const fx = x - ix;
  const fy = y - iy;
  const sx = fx * fx * (3 - 2 * fx);
  const sy = fy * fy * (3 - 2 * fy);
  const a = hash2(ix, iy, seed);
  const b = hash2(ix + 1, iy, seed);
  const c = hash2(ix, iy + 1, seed);
  const d = hash2(ix + 1, iy + 1, seed);
  return a + (b - a) * sx + (c - a) * sy + (a - b - c + d) * sx * sy;
}

/** Fractal sum of value noise, centred on 0, roughly in [-0.5, 0.5]. */
export function fractalNoise(x: number, y: number, seed: number, octaves: number): number {
  let sum = 0;
  let amplitude = 0.5;
  let frequency = 1;
  let norm = 0;
  for (let octave = 0; octave < octaves; octave++) {
    sum += amplitude * (valueNoise(x * frequency, y * frequency, seed + octave * 101) - 0.5);
    norm += amplitude;
    amplitude *= 0.5;
    frequency *= 2.03;
  }
  return sum / norm;
}

/** Per-pixel white noise in [0, 1), for speckle and grain that must stay sharp at one pixel. */
export function pixelHash(ix: number, iy: number, seed: number): number {
  return hash2(ix, iy, seed ^ 0x5bd1e995);
}

/** Approximately normal noise (sum of three uniforms), unit variance, for sensor grain. */
export function fillGrain(length: number, random: () => number): Float32Array {
  const grain = new Float32Array(length);
  for (let i = 0; i < length; i++) grain[i] = (random() + random() + random() - 1.5) * 2;
  return grain;
}
