import { describe, expect, it } from 'vitest';
import { codesByFrameId, exposureStrip, focusMapOf, numberChecks, summariseChecks } from '@shared/check-pictures';
import { defaultCheckThresholds, runStackChecks } from '@shared/checks';
import type { StackCheckFrame } from '@shared/schemas/checks';
import { frameColour, relativeLuminance, textOn } from '@/features/checks/lib/palette';
import { renderStack } from '../../scripts/lib/stack-renderer';
import { parseRenderStackOptions } from '../../scripts/lib/stack-renderer/options';
import { renderScene } from '../../scripts/lib/stack-renderer/scene';
import { focusDepthsFor } from '../../scripts/lib/stack-renderer/render-stack';
import { computeFrameStats } from '../../worker/lib/frame-stats';

const frame = (index: number, over: Partial<StackCheckFrame> = {}): StackCheckFrame => ({ frameId: `f${index}`, index, ...over });

describe('exposure strip', () => {
  it('gives each frame its stops against the median (sRGB decoded, IEC 61966-2-1) and keeps unmeasured frames', () => {
    // 0.5 encoded is 0.2140 linear; 0.7354 encoded is 0.4990 linear: log2(0.4990 / 0.2140) = 1.22 stops
    const strip = exposureStrip([frame(0, { meanLuminance: 0.5 }), frame(2, { meanLuminance: 0.5 }), frame(3), frame(4, { meanLuminance: 0.7354 })]);
    expect(strip.map((f) => f.number)).toEqual([1, 3, 4, 5]);
    expect(strip[0].stops).toBe(0);
    expect(strip[2]).toMatchObject({ stops: null, meanLuminance: null });
    expect(strip[3].stops).toBeCloseTo(Math.log2(0.499 / 0.214), 2);
  });
});

describe('focus map', () => {
  it('needs three measured frames', () => {
    expect(focusMapOf([frame(0, { sharpnessGrid: Array(48).fill(1) }), frame(1, { sharpnessGrid: Array(48).fill(2) })], defaultCheckThresholds)).toBeNull();
  });

  it('names the frame each cell peaks in, and leaves cells without detail empty', () => {
    // cell c peaks at frame c % 5; cell 47 is flat (no detail)
    const frames = Array.from({ length: 5 }, (_, k) =>
      frame(k, { meanLuminance: 0.4, sharpnessGrid: Array.from({ length: 48 }, (_, c) => (c === 47 ? 5 : 100 * Math.exp(-((k - (c % 5)) ** 2)))) }),
    );
    const map = focusMapOf(frames, defaultCheckThresholds)!;
    expect(map.sharpestFrameNumbers.slice(0, 10)).toEqual([1, 2, 3, 4, 5, 1, 2, 3, 4, 5]);
    expect(map.sharpestFrameNumbers[47]).toBeNull();
  });

  it('on a rendered stack, points each detailed cell at a frame focused within the depths the cell holds', async () => {
    // The renderer's scene knows every pixel's depth: the truth the map is checked against.
    const options = { scene: 'beetle', seed: 12, widthPx: 320, heightPx: 213, frameCount: 12 } as const;
    const { files } = await renderStack(options);
    const stats = await Promise.all(files.map((f) => computeFrameStats(f.buffer)));
    const map = focusMapOf(stats.map((s, index) => frame(index, { meanLuminance: s.meanLuminance, sharpnessGrid: s.sharpnessGrid })), defaultCheckThresholds)!;
    const resolved = parseRenderStackOptions(options);
    const { focusDepthsMm, stepMm } = focusDepthsFor(resolved);
    const scene = renderScene(resolved.scene, { widthPx: 320, heightPx: 213, seed: 12, subjectNearMm: 0, subjectFarMm: 4 });
    let agree = 0;
    let detailed = 0;
    // the same test for a frame half the stack away, to show the criterion can fail
    let shiftedAgree = 0;
    map.sharpestFrameNumbers.forEach((n, cell) => {
      if (n === null) return;
      detailed += 1;
      const [col, row] = [cell % 8, Math.floor(cell / 8)];
      let near = Infinity;
      let far = -Infinity;
      for (let y = Math.floor((row * 213) / 6); y < Math.floor(((row + 1) * 213) / 6); y++) {
        for (let x = Math.floor((col * 320) / 8); x < Math.floor(((col + 1) * 320) / 8); x++) {
          const depth = Math.min(scene.depthMm[y * 320 + x], 4 + stepMm);
          near = Math.min(near, depth);
          far = Math.max(far, depth);
        }
      }
      const focus = focusDepthsMm[n - 1];
      if (focus >= near - stepMm && focus <= far + stepMm) agree += 1;
      const shifted = focusDepthsMm[(n - 1 + 6) % 12];
      if (shifted >= near - stepMm && shifted <= far + stepMm) shiftedAgree += 1;
    });
    // measured: 48 of 48 cells agree; a frame 6 steps away agrees in 6 of 48
    expect(detailed).toBeGreaterThan(12);
    expect(agree / detailed).toBeGreaterThanOrEqual(0.9);
    expect(shiftedAgree / detailed).toBeLessThan(0.5);
  });
});

describe('marks and summary', () => {
  const frames = Array.from({ length: 16 }, (_, i) => frame(i));
  const checks = numberChecks(
    runStackChecks({ frames: frames.map((f) => ({ ...f, fNumber: f.index < 6 ? 8 : 11 })) }),
    frames,
  );

  it('number the frames a check names as the stack page does', () => {
    expect(checks.map((c) => [c.code, c.frameNumbers])).toEqual([['setting-change', [7]]]);
  });

  it('give each named frame the check code once', () => {
    const codes = codesByFrameId([
      { code: 'focus-gap', frameIds: ['a', 'b'] },
      { code: 'focus-gap', frameIds: ['b', 'c'] },
      { code: 'exposure-jump', frameIds: ['b'] },
    ]);
    expect(Object.fromEntries(codes)).toEqual({ a: ['focus-gap'], b: ['focus-gap', 'exposure-jump'], c: ['focus-gap'] });
  });

  it('sum the checks up in one line', () => {
    expect(summariseChecks([])).toMatch(/^No problems found/);
    expect(summariseChecks([{ code: 'exposure-jump', frameNumbers: [7] }, { code: 'focus-gap', frameNumbers: [11, 12] }])).toBe(
      '2 problems: exposure jump at frame 7, focus gap between frames 11 and 12.',
    );
    expect(summariseChecks([{ code: 'plan-mismatch', frameNumbers: [] }])).toBe('1 problem: frame count differs from the linked plan.');
  });
});

describe('focus-map palette', () => {
  it('darkens steadily from the first frame to the last, so the order reads without colour', () => {
    const lum = Array.from({ length: 20 }, (_, i) => relativeLuminance(frameColour(i + 1, 20)));
    lum.slice(1).forEach((l, i) => expect(l).toBeLessThan(lum[i]));
  });

  it('writes frame numbers with at least 4.5:1 contrast (WCAG 2.1, success criterion 1.4.3)', () => {
    // WCAG 2.1 contrast ratio: (L1 + 0.05) / (L2 + 0.05)
    for (let n = 1; n <= 30; n++) {
      const bg = frameColour(n, 30);
      const [a, b] = [relativeLuminance(bg), relativeLuminance(textOn(bg))];
      expect((Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05), bg).toBeGreaterThanOrEqual(4.5);
    }
  });
});
