import { createRandom, fractalNoise, pixelHash, randomBetween, valueNoise } from './noise';
import { emptySceneImage, pixelToScene, type SceneImage, type SceneRequest } from './scene';

interface Drop {
  cx: number;
  cy: number;
  radius: number;
  heightMm: number;
}

/**
 * A dew drop (with a few small satellites) on a tilted, veined leaf in front of a far, dark
 * background. Lengths are in picture heights, so the scene looks the same at any size.
 */
export function renderDropOnLeaf(request: SceneRequest): SceneImage {
  const { widthPx, heightPx, seed, subjectNearMm, subjectFarMm } = request;
  const random = createRandom(seed);
  const rangeMm = subjectFarMm - subjectNearMm;
  const aspect = widthPx / heightPx;

  const leafAngle = randomBetween(random, -0.45, 0.45);
  const leafCx = randomBetween(random, -0.06, 0.06) * aspect;
  const leafCy = randomBetween(random, -0.05, 0.05);
  const leafHalfLength = 0.62 * aspect;
  const leafHalfWidth = randomBetween(random, 0.5, 0.6);
  const tiltAngle = randomBetween(random, 0, Math.PI * 2);
  const tiltX = Math.cos(tiltAngle);
  const tiltY = Math.sin(tiltAngle);
  const tiltExtent = Math.abs(tiltX) * aspect * 0.5 + Math.abs(tiltY) * 0.5;
  const leafNearMm = subjectNearMm + 0.15 * rangeMm;
  const leafDepthAt = (u: number, v: number) =>
    leafNearMm + (subjectFarMm - leafNearMm) * (0.5 + (0.5 * (u * tiltX + v * tiltY)) / tiltExtent);

  const mainRadius = randomBetween(random, 0.13, 0.19);
  const drops: Drop[] = [
    {
      cx: leafCx + randomBetween(random, -0.25, 0.25) * aspect,
      cy: leafCy + randomBetween(random, -0.12, 0.12),
      radius: mainRadius,
      heightMm: 0,
    },
  ];
  const satelliteCount = 3 + Math.floor(random() * 4);
  for (let i = 0; i < satelliteCount; i++) {
    drops.push({
      cx: leafCx + randomBetween(random, -0.45, 0.45) * aspect,
      cy: leafCy + randomBetween(random, -0.3, 0.3),
      radius: randomBetween(random, 0.018, 0.045),
      heightMm: 0,
    });
  }
  for (const drop of drops) {
    const base = leafDepthAt(drop.cx, drop.cy);
    drop.heightMm = Math.min(base - subjectNearMm, (drop.radius / mainRadius) * 0.38 * rangeMm);
  }
  const backgroundMm = subjectFarMm + 1.5 * rangeMm;
  const cosLeaf = Math.cos(leafAngle);
  const sinLeaf = Math.sin(leafAngle);
  const veinSlope = randomBetween(random, 0.7, 1.1);
  const veinSpacing = randomBetween(random, 0.08, 0.11);

  const leafColour = (u: number, v: number, out: number[]): boolean => {
    const along = (u - leafCx) * cosLeaf + (v - leafCy) * sinLeaf;
    const across = -(u - leafCx) * sinLeaf + (v - leafCy) * cosLeaf;
    const theta = Math.atan2(across, along);
    const edge = 1 + 0.025 * Math.sin(theta * 38) + 0.05 * Math.sin(theta * 3 + seed);
    const r = (along / leafHalfLength) ** 2 + (across / leafHalfWidth) ** 2;
    if (r > edge * edge) return false;
    const patch = fractalNoise(u * 4, v * 4, seed + 7, 3);
    const cells = valueNoise(u * 190, v * 190, seed + 11) - 0.5;
    const grain = pixelHash(Math.floor(u * 600), Math.floor(v * 600), seed) - 0.5;
    const midrib = Math.exp(-((across / 0.009) ** 2));
    const veinCoord = (along - Math.abs(across) * veinSlope) / veinSpacing;
    const veinDistance = (veinCoord - Math.round(veinCoord)) * veinSpacing;
    const vein = Math.exp(-((veinDistance / 0.0045) ** 2)) * (1 - midrib);
    const spotU = Math.floor(u / 0.014);
    const spotV = Math.floor(v / 0.014);
    const hasSpot = pixelHash(spotU, spotV, seed + 3) < 0.28;
    const spotDx = u - (spotU + 0.3 + 0.4 * pixelHash(spotU, spotV, seed + 4)) * 0.014;
    const spotDy = v - (spotV + 0.3 + 0.4 * pixelHash(spotU, spotV, seed + 5)) * 0.014;
    const spot = hasSpot ? Math.exp(-(spotDx * spotDx + spotDy * spotDy) / 0.0035 ** 2) : 0;
    const light = 0.85 + 0.3 * (0.5 - v) + 0.25 * patch + 0.22 * cells + 0.12 * grain;
    const yellow = Math.max(0, r - 0.6) * 0.6;
    out[0] = (0.05 + 0.05 * yellow) * light * (1 + 2.2 * vein + 1.6 * midrib) * (1 - 0.6 * spot);
    out[1] = (0.14 + 0.03 * yellow) * light * (1 + 1.1 * vein + 0.8 * midrib) * (1 - 0.7 * spot);
    out[2] = 0.022 * light * (1 + 0.6 * vein) * (1 - 0.3 * spot) + 0.01 * spot;
    return true;
  };

  const image = emptySceneImage(widthPx, heightPx);
  const colour = [0, 0, 0];
  for (let y = 0; y < heightPx; y++) {
    for (let x = 0; x < widthPx; x++) {
      const [u, v] = pixelToScene(x, y, widthPx, heightPx);
      const pixel = y * widthPx + x;
      let depthMm = backgroundMm;
      const onLeaf = leafColour(u, v, colour);
      if (onLeaf) {
        depthMm = leafDepthAt(u, v);
        const shadow = dropShadow(drops, u, v);
        colour[0] *= shadow;
        colour[1] *= shadow;
        colour[2] *= shadow;
      } else {
        const glow = 0.5 + fractalNoise(u * 2.2, v * 2.2, seed + 21, 2);
        colour[0] = 0.012 + 0.03 * glow;
        colour[1] = 0.02 + 0.045 * glow;
        colour[2] = 0.018 + 0.02 * (1 - glow);
      }
      for (const drop of drops) {
        const dx = (u - drop.cx) / drop.radius;
        const dy = (v - drop.cy) / drop.radius;
        const rho2 = dx * dx + dy * dy;
        if (rho2 >= 1 || !onLeaf) continue;
        const cap = Math.sqrt(1 - rho2);
        depthMm = Math.min(depthMm, leafDepthAt(drop.cx, drop.cy) - drop.heightMm * cap);
        // the drop acts as a small lens: it shows the leaf behind it shrunk and upside down
        if (!leafColour(drop.cx - dx * drop.radius * 0.55, drop.cy - dy * drop.radius * 0.55, colour)) {
          colour[0] = colour[1] = colour[2] = 0.03;
        }
        const rim = 1 - 0.75 * rho2 ** 4;
        const glint = 0.3 * Math.exp(-((dx + 0.38) ** 2 + (dy + 0.4) ** 2) / 0.012);
        const caustic = 0.09 * Math.exp(-((dx - 0.3) ** 2 + (dy - 0.45) ** 2) / 0.05);
        colour[0] = colour[0] * 1.15 * rim + glint + caustic * 0.8;
        colour[1] = colour[1] * 1.15 * rim + glint + caustic;
        colour[2] = colour[2] * 1.15 * rim + glint + caustic * 0.5;
      }
      image.depthMm[pixel] = depthMm;
      image.linearRgb[pixel * 3] = colour[0];
      image.linearRgb[pixel * 3 + 1] = colour[1];
      image.linearRgb[pixel * 3 + 2] = colour[2];
    }
  }
  return image;
}

function dropShadow(drops: Drop[], u: number, v: number): number {
  let shade = 1;
  for (const drop of drops) {
    const dx = (u - drop.cx - drop.radius * 0.25) / drop.radius;
    const dy = (v - drop.cy - drop.radius * 0.3) / drop.radius;
    const rho2 = dx * dx + dy * dy;
    if (rho2 < 1.4) shade *= 1 - 0.35 * Math.exp(-((rho2 - 1) ** 2) / 0.08);
  }
  return shade;
}
