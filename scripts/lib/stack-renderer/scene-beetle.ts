import { createRandom, fractalNoise, pixelHash, randomBetween, valueNoise } from './noise';
import { emptySceneImage, pixelToScene, type SceneImage, type SceneRequest } from './scene';

interface BodyPart {
  cx: number;
  cy: number;
  halfLength: number;
  halfWidth: number;
  heightMm: number;
  kind: 'elytra' | 'pronotum' | 'head';
}

const LIGHT = normalise([-0.45, -0.55, 0.7]);

/**
 * A museum beetle (textured ellipsoids: wing cases, neck shield, head) standing on a tilted
 * cork board. Lengths are in picture heights.
 */
export function renderBeetle(request: SceneRequest): SceneImage {
  const { widthPx, heightPx, seed, subjectNearMm, subjectFarMm } = request;
  const random = createRandom(seed ^ 0x2545f491);
  const rangeMm = subjectFarMm - subjectNearMm;
  const aspect = widthPx / heightPx;
  const angle = randomBetween(random, -0.5, 0.5);
  const cosA = Math.cos(angle);
  const sinA = Math.sin(angle);
  const cx = randomBetween(random, -0.04, 0.08) * aspect;
  const cy = randomBetween(random, -0.06, 0.06);
  const tiltAngle = randomBetween(random, 0, Math.PI * 2);
  const tiltX = Math.cos(tiltAngle);
  const tiltY = Math.sin(tiltAngle);
  const tiltExtent = Math.abs(tiltX) * aspect * 0.5 + Math.abs(tiltY) * 0.5;
  const boardNearMm = subjectNearMm + 0.4 * rangeMm;
  const boardDepthAt = (u: number, v: number) =>
    boardNearMm + (subjectFarMm - boardNearMm) * (0.5 + (0.5 * (u * tiltX + v * tiltY)) / tiltExtent);
  const bodyLength = randomBetween(random, 0.36, 0.42);
  const parts: BodyPart[] = [
    { cx: 0.1, cy: 0, halfLength: bodyLength, halfWidth: bodyLength * 0.62, heightMm: 0, kind: 'elytra' },
    { cx: -bodyLength * 0.95, cy: 0, halfLength: bodyLength * 0.32, halfWidth: bodyLength * 0.48, heightMm: 0, kind: 'pronotum' },
    { cx: -bodyLength * 1.38, cy: 0, halfLength: bodyLength * 0.17, halfWidth: bodyLength * 0.26, heightMm: 0, kind: 'head' },
  ];
  const topMm = subjectNearMm;
  const baseMm = boardDepthAt(cx, cy);
  parts[0].heightMm = baseMm - topMm;
  parts[1].heightMm = (baseMm - topMm) * 0.7;
  parts[2].heightMm = (baseMm - topMm) * 0.45;
  const hue = random();
  const metal = [0.06 + 0.1 * hue, 0.09 + 0.05 * (1 - hue), 0.05 + 0.08 * random()];

  const image = emptySceneImage(widthPx, heightPx);
  for (let y = 0; y < heightPx; y++) {
    for (let x = 0; x < widthPx; x++) {
      const [u, v] = pixelToScene(x, y, widthPx, heightPx);
      const pixel = y * widthPx + x;
      const along = (u - cx) * cosA + (v - cy) * sinA;
      const across = -(u - cx) * sinA + (v - cy) * cosA;
      let depthMm = boardDepthAt(u, v);
      const rgb = boardColour(u, v, seed);
      const leg = legShade(along, across, bodyLength);
      if (leg > 0) {
        depthMm -= 0.08 * rangeMm * leg;
        for (let c = 0; c < 3; c++) rgb[c] = rgb[c] * (1 - leg) + 0.012 * leg;
      }
      for (const part of parts) {
        const a = (along - part.cx) / part.halfLength;
        const b = across / part.halfWidth;
        const rho2 = a * a + b * b;
        if (rho2 >= 1) continue;
        const h = Math.sqrt(1 - rho2);
        const partDepth = baseMm - part.heightMm * h;
        if (partDepth > depthMm) continue;
        depthMm = partDepth;
        const normal = normalise([a / part.halfLength, b / part.halfWidth, (h * 1.4) / 0.3]);
        const diffuse = Math.max(0, dot(normal, LIGHT));
        const halfway = normalise([LIGHT[0], LIGHT[1], LIGHT[2] + 1]);
        const specular = Math.max(0, dot(normal, halfway)) ** 40;
        const texture = surfaceTexture(part, a, b, along, across, seed);
        for (let c = 0; c < 3; c++) rgb[c] = metal[c] * texture * (0.35 + 0.9 * diffuse) + 0.3 * specular;
      }
      image.depthMm[pixel] = depthMm;
      image.linearRgb[pixel * 3] = rgb[0];
      image.linearRgb[pixel * 3 + 1] = rgb[1];
      image.linearRgb[pixel * 3 + 2] = rgb[2];
    }
  }
  return image;
}

function boardColour(u: number, v: number, seed: number): number[] {
  const fibre = fractalNoise(u * 9, v * 9, seed + 31, 3);
  const pore = valueNoise(u * 150, v * 150, seed + 33) - 0.5;
  const grain = pixelHash(Math.floor(u * 650), Math.floor(v * 650), seed + 35) - 0.5;
  const light = 0.9 + 0.6 * fibre + 0.35 * pore + 0.2 * grain - 0.2 * v;
  return [0.2 * light, 0.12 * light, 0.06 * light];
}

/** Six thin legs and two feelers as dark strokes on the board. */
function legShade(along: number, across: number, bodyLength: number): number {
  let shade = 0;
  const side = Math.sign(across) || 1;
  const reach = Math.abs(across);
  for (const [start, slope] of [[-0.7, -0.6], [-0.1, 0.1], [0.45, 0.7]]) {
    const x0 = start * bodyLength;
    const distance = Math.abs(along - x0 - slope * (reach - 0.2 * bodyLength)) / Math.hypot(1, slope);
    if (reach > 0.2 * bodyLength && reach < 1.25 * bodyLength) {
      shade = Math.max(shade, Math.exp(-((distance / 0.006) ** 2)));
    }
  }
  const feelerX = along + 1.5 * bodyLength;
  if (feelerX < 0 && feelerX > -0.55 * bodyLength) {
    const distance = Math.abs(reach - 0.12 * bodyLength + feelerX * 0.8 * side * side);
    shade = Math.max(shade, Math.exp(-((distance / 0.004) ** 2)));
  }
  return shade;
}

function surfaceTexture(part: BodyPart, a: number, b: number, along: number, across: number, seed: number): number {
  const micro = 0.8 + 0.5 * (valueNoise(along * 230, across * 230, seed + 41) - 0.5);
  if (part.kind !== 'elytra') {
    const pits = pixelHash(Math.floor(along * 140), Math.floor(across * 140), seed + 43) < 0.3 ? 0.55 : 1;
    return micro * pits;
  }
  const suture = 1 - 0.7 * Math.exp(-(((b * part.halfWidth) / 0.004) ** 2));
  const rowCoord = (b * 9 + 9) % 1;
  const inRow = Math.abs(rowCoord - 0.5) < 0.09;
  const pitCoord = (a * 38 + 40) % 1;
  const pit = inRow && Math.abs(pitCoord - 0.5) < 0.22 ? 0.25 : 1;
  return micro * suture * pit;
}

function dot(p: number[], q: number[]): number {
  return p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
}

function normalise(p: number[]): number[] {
  const length = Math.hypot(p[0], p[1], p[2]);
  return [p[0] / length, p[1] / length, p[2] / length];
}
