import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { framesFor, planStack, MAX_LISTED_POSITIONS } from '@shared/optics';
import { stackPlanSchema, type PlanInput } from '@shared/schemas/plan-input';

const SENSORS = [
  { widthMm: 36, heightMm: 24, pixelsAcross: 6000 },
  { widthMm: 23.5, heightMm: 15.6, pixelsAcross: 3872 },
  { widthMm: 17.3, heightMm: 13.0, pixelsAcross: 5184 },
  { widthMm: 13.2, heightMm: 8.8, pixelsAcross: 5472 },
];

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

// Close-up setups from 0.1× to ~10×, with and without a rail, in both models.
const planInput: fc.Arbitrary<PlanInput> = fc.record({
  focalLengthMm: num(20, 200),
  extensionMm: num(0, 200),
  baseMagnification: num(0.1, 2),
  pupilMagnification: num(0.4, 2.5),
  fNumber: num(1.4, 32),
  cocMm: num(0.005, 0.04),
  sensor: fc.constantFrom(...SENSORS),
  depthMm: num(0.01, 50),
  overlap: num(0, 0.8),
  dofModel: fc.constantFrom('geometric' as const, 'wave' as const),
  railStepUm: fc.option(num(0.5, 500), { nil: undefined }),
});

const RUNS = { numRuns: 300 };

describe('stack plan properties', () => {
  it('never needs fewer frames for more depth', () => {
    fc.assert(
      fc.property(planInput, num(0.001, 10), (input, growth) => {
        const deeper = Math.min(1000, input.depthMm * (1 + growth));
        expect(planStack({ ...input, depthMm: deeper }).frames).toBeGreaterThanOrEqual(planStack(input).frames);
      }),
      RUNS,
    );
  });

  it('never needs fewer frames at a wider aperture', () => {
    fc.assert(
      fc.property(planInput, num(0.01, 3), (input, openBy) => {
        const wider = Math.max(0.5, input.fNumber / (1 + openBy));
        expect(planStack({ ...input, fNumber: wider }).frames).toBeGreaterThanOrEqual(planStack(input).frames);
      }),
      RUNS,
    );
  });

  it('keeps the step within one frame’s depth of field unless the rail is too coarse', () => {
    fc.assert(
      fc.property(planInput, (input) => {
        const plan = planStack(input);
        if (plan.stepMm === null || plan.frameDofMm === null) return;
        const coarse = plan.warnings.some((w) => w.code === 'rail-too-coarse');
        if (!coarse) expect(plan.stepMm).toBeLessThanOrEqual(plan.frameDofMm * (1 + 1e-12));
        else expect(plan.stepMm).toBeCloseTo((input.railStepUm as number) / 1000, 12);
      }),
      RUNS,
    );
  });

  it('moves the rail only in whole steps', () => {
    fc.assert(
      fc.property(planInput, num(0.5, 500), (input, railStepUm) => {
        const plan = planStack({ ...input, railStepUm });
        expect(plan.railSteps).not.toBeNull();
        const steps = plan.railSteps as number[];
        expect(steps).toHaveLength(plan.positionsMm.length);
        steps.forEach((s, i) => {
          expect(Number.isInteger(s)).toBe(true);
          expect(plan.positionsMm[i]).toBeCloseTo((s * railStepUm) / 1000, 9);
        });
        if (plan.stepMm !== null) expect(Number.isInteger(Math.round((plan.stepMm * 1000) / railStepUm))).toBe(true);
      }),
      RUNS,
    );
  });

  it('keeps every position within [0, depth + step], increasing, and the plan JSON-safe', () => {
    fc.assert(
      fc.property(planInput, (input) => {
        const plan = planStack(input);
        const step = plan.stepMm ?? 0;
        expect(plan.positionsMm).toHaveLength(Math.min(plan.frames, MAX_LISTED_POSITIONS));
        plan.positionsMm.forEach((x, i) => {
          expect(x).toBeGreaterThanOrEqual(0);
          expect(x).toBeLessThanOrEqual(input.depthMm + step);
          if (i > 0) expect(x).toBeGreaterThan(plan.positionsMm[i - 1]);
        });
        if (!plan.positionsTruncated && plan.frames > 1) {
          expect(plan.positionsMm.at(-1)).toBeGreaterThanOrEqual(input.depthMm * (1 - 1e-9));
        }
        expect(stackPlanSchema.safeParse(JSON.parse(JSON.stringify(plan))).success).toBe(true);
      }),
      RUNS,
    );
  });

  it('counts frames exactly for decimal depths and steps despite binary rounding', () => {
    // Depth a/10^d and step b/10^d: n = ⌈a/b⌉ + 1 in integer arithmetic.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), fc.integer({ min: 1, max: 10_000 }), fc.integer({ min: 0, max: 4 }), (a, b, d) => {
        const scale = 10 ** d;
        expect(framesFor(a / scale, b / scale)).toBe(Math.floor((a + b - 1) / b) + 1);
      }),
      { numRuns: 2000 },
    );
  });
});
