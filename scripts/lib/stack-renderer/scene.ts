import { renderDropOnLeaf } from './scene-drop-on-leaf';
import { renderBeetle } from './scene-beetle';

export const sceneKinds = ['drop-on-leaf', 'beetle'] as const;
export type SceneKind = (typeof sceneKinds)[number];

export interface SceneRequest {
  widthPx: number;
  heightPx: number;
  seed: number;
  /** depth of the subject's nearest and farthest points, mm from an arbitrary zero */
  subjectNearMm: number;
  subjectFarMm: number;
}

/** An all-in-focus picture of the scene in linear light, with the depth of every pixel. */
export interface SceneImage {
  widthPx: number;
  heightPx: number;
  /** linear-light RGB, 3 values per pixel, row-major, 0..1 for a normal exposure */
  linearRgb: Float32Array;
  /** distance of each pixel's surface, mm; larger is farther */
  depthMm: Float32Array;
}

export function renderScene(kind: SceneKind, request: SceneRequest): SceneImage {
  const image = kind === 'beetle' ? renderBeetle(request) : renderDropOnLeaf(request);
  stretchSubjectDepths(image, request);
  return image;
}

/**
 * Maps the subject's actual depths onto [subjectNearMm, subjectFarMm], so a stack planned over
 * that range starts at the subject's nearest point and ends at its farthest. The background,
 * placed beyond subjectFarMm by the scene, stays where it is.
 */
function stretchSubjectDepths(image: SceneImage, { subjectNearMm, subjectFarMm }: SceneRequest): void {
  const { depthMm } = image;
  let nearest = Infinity;
  let farthest = -Infinity;
  for (const depth of depthMm) {
    if (depth > subjectFarMm) continue;
    nearest = Math.min(nearest, depth);
    farthest = Math.max(farthest, depth);
  }
  if (!(farthest > nearest)) return;
  const scale = (subjectFarMm - subjectNearMm) / (farthest - nearest);
  for (let i = 0; i < depthMm.length; i++) {
    if (depthMm[i] <= subjectFarMm) depthMm[i] = subjectNearMm + (depthMm[i] - nearest) * scale;
  }
}

/** Pixel geometry shared by the scenes: coordinates in picture heights from the centre. */
export function pixelToScene(x: number, y: number, widthPx: number, heightPx: number): [number, number] {
  return [(x + 0.5 - widthPx / 2) / heightPx, (y + 0.5 - heightPx / 2) / heightPx];
}

export function emptySceneImage(widthPx: number, heightPx: number): SceneImage {
  return {
    widthPx,
    heightPx,
    linearRgb: new Float32Array(widthPx * heightPx * 3),
    depthMm: new Float32Array(widthPx * heightPx),
  };
}
