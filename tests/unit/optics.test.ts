import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import {
  apertureSweep,
  cocForSensor,
  framesFor,
  planStack,
  THIRD_STOP_SERIES,
  waveDofMm,
  MAX_LISTED_POSITIONS,
} from '@shared/optics';
import { apertureSweepSchema, stackPlanSchema, type PlanInput } from '@shared/schemas/plan-input';

const APS_C_10MP = { widthMm: 23.5, heightMm: 15.6, pixelsAcross: 3872 };
const FULL_FRAME = { widthMm: 36, heightMm: 24, pixelsAcross: 6000 };

// Our scenario: dew drops on a fern frond, 50 mm lens on tubes, 4 mm of depth to cover.
const fern: PlanInput = {
  focalLengthMm: 50,
  extensionMm: 25,
  fNumber: 8,
  cocMm: 0.03,
  sensor: FULL_FRAME,
  depthMm: 4,
  overlap: 0.2,
  dofModel: 'geometric',
};

const codes = (p: { warnings: { code: string }[] }) => p.warnings.map((w) => w.code);

describe('magnification, working f-number and light loss', () => {
  it.each([
    // Extension-tube tutorials (thin lens, m = e / f at infinity focus): 25 mm on 50 mm → 0.5×, 50 mm → 1×.
    [25, 0.5],
    [50, 1],
  ])('%d mm of extension on a 50 mm lens at infinity gives %d×', (extensionMm, expected) => {
    expect(planStack({ ...fern, extensionMm }).magnification).toBeCloseTo(expected, 12);
  });

  it('adds extension to the lens’s own magnification', () => {
    // Thin lens: extra extension e moves the image plane by e, adding e / f to m₀.
    expect(planStack({ ...fern, baseMagnification: 0.25, extensionMm: 25 }).magnification).toBeCloseTo(0.75, 12);
  });

  it.each([
    // Wikipedia, "F-number" (working f-number): N_w = (1 + m/P)·N. f/8 at 1:1 with P = 1 → f/16.
    [8, 50, 1, 16],
    // Same formula with a retrofocus lens (P = 0.5): f/4 at 1:1 → 4·(1 + 2) = f/12.
    [4, 50, 0.5, 12],
    // At infinity (m = 0) the working f-number is the marked one.
    [5.6, 0, 1, 5.6],
  ])('f/%d with %d mm extension and P = %d works at f/%d', (fNumber, extensionMm, pupilMagnification, expected) => {
    const plan = planStack({ ...fern, fNumber, extensionMm, pupilMagnification });
    expect(plan.workingFNumber).toBeCloseTo(expected, 12);
  });

  it('loses 2 stops (a factor of 4) at 1:1 with a symmetric lens', () => {
    // common practice: life size with a symmetric lens costs two stops of light.
    const plan = planStack({ ...fern, extensionMm: 50 });
    expect(plan.lightLossStops).toBeCloseTo(2, 12);
    expect(2 ** plan.lightLossStops).toBeCloseTo(4, 12);
  });

  it('loses about 1.2 stops (factor 2.25) at half life size', () => {
    // common practice (from memory): the bellows factor (1 + m)² at 0.5× is 2.25, about 1⅙ stops.
    expect(2 ** planStack(fern).lightLossStops).toBeCloseTo(2.25, 12);
  });
});

describe('geometric depth of field', () => {
  it('matches the close-up approximation 2Nc(1+m/P)/m² at 1:1 (0.96 mm at f/8, c = 0.03 mm)', () => {
    // Wikipedia, "Depth of field", close-up: DOF ≈ 2Nc(1 + m/P)/m²; N = 8, c = 0.03, m = 1 → 0.96 mm.
    const plan = planStack({ ...fern, focalLengthMm: 100, extensionMm: 100 });
    expect(plan.frameDofMm).not.toBeNull();
    expect(Math.abs((plan.frameDofMm as number) - 0.96) / 0.96).toBeLessThan(1e-4);
  });

  it('follows the pupil magnification term: P = 0.5 at 1:1 gives 2·8·0.03·3 = 1.44 mm', () => {
    // Wikipedia, "Depth of field", close-up formula with (1 + m/P).
    const plan = planStack({ ...fern, focalLengthMm: 100, extensionMm: 100, pupilMagnification: 0.5 });
    expect(Math.abs((plan.frameDofMm as number) - 1.44) / 1.44).toBeLessThan(1e-4);
  });

  it.each([200, 500, 1000, 5000])('agrees with the near/far-limit formulas at %d mm subject distance', (distanceMm) => {
    // Wikipedia, "Depth of field" (from memory): H = f²/(Nc) + f, near = s(H − f)/(H + s − 2f),
    // far = s(H − f)/(H − s); thin lens m = f/(s − f). An independent route to the same DOF.
    const f = 100, N = 8, c = 0.03;
    const H = (f * f) / (N * c) + f;
    const expected = (distanceMm * (H - f)) / (H - distanceMm) - (distanceMm * (H - f)) / (H + distanceMm - 2 * f);
    const plan = planStack({ ...fern, focalLengthMm: f, fNumber: N, cocMm: c, extensionMm: 0, baseMagnification: f / (distanceMm - f) });
    expect(Math.abs((plan.frameDofMm as number) - expected) / expected).toBeLessThan(1e-9);
  });

  it('is unbounded at and beyond the hyperfocal distance', () => {
    // Wikipedia, "Hyperfocal distance": focused at H ≈ f²/(Nc) + f the far limit reaches infinity.
    const f = 50, N = 8, c = 0.03;
    const H = (f * f) / (N * c) + f;
    const at = (s: number) => planStack({ ...fern, extensionMm: 0, baseMagnification: f / (s - f) });
    expect(at(0.5 * H).frameDofMm).not.toBeNull();
    for (const s of [1.001 * H, 2 * H]) {
      const plan = at(s);
      expect(plan.frameDofMm).toBeNull();
      expect(plan.frames).toBe(1);
      expect(codes(plan)).toContain('dof-unbounded');
    }
  });
});

describe('wave-model depth of field against MicroscopyU, "Depth of Field and Depth of Focus", Table 1', () => {
  // Table 1 (n = 1, λ = 0.55 µm, detector term e unstated): objective, NA, depth of field in µm.
  const table = [
    [4, 0.1, 55.5],
    [10, 0.25, 8.5],
    [20, 0.4, 5.8],
    [40, 0.65, 1.0],
    [60, 0.85, 0.4],
    [100, 0.95, 0.19],
  ] as const;
  const waveTermUm = (na: number) => waveDofMm(0.55, na, 0, 1) * 1000; // λ·n/NA² alone

  it.each(table.filter(([, na]) => na <= 0.25))('%d×/%d: the wave term λ/NA² is within 5 % of %d µm', (_m, na, tableUm) => {
    // At low NA the table is dominated by the λ/NA² term; its small remaining difference is the
    // table's own rounding and detector term, hence 5 %.
    expect(Math.abs(waveTermUm(na) - tableUm) / tableUm).toBeLessThan(0.05);
  });

  it.each(table.filter(([, na]) => na >= 0.65))('%d×/%d: paraxial λ/NA² overestimates %d µm by 1/√(1 − NA²)', (_m, na, tableUm) => {
    // Our formula is the paraxial one. The table's high-NA rows match λ·√(1 − NA²)/NA² within 3 %
    // (our own fit; the page does not state it), so we are conservative there: thinner steps, no gaps.
    expect(waveTermUm(na)).toBeGreaterThan(tableUm);
    expect(Math.abs(waveTermUm(na) * Math.sqrt(1 - na * na) - tableUm) / tableUm).toBeLessThan(0.03);
  });

  it('20×/0.40: the table (5.8 µm) lies above λ/NA² (3.44 µm), so our step is finer than the table’s', () => {
    // The table does not say which detector term e it used for this row; we only claim the side.
    expect(waveTermUm(0.4)).toBeLessThan(5.8);
    expect(waveTermUm(0.4)).toBeGreaterThan(5.8 / 2);
  });

  it.each(table)('planStack with a %d×/%d objective reproduces the wave term plus the detector term', (m, na) => {
    // With NA given, N_w = m/(2·NA), so the plan's NA is the objective's and d = λ/NA² + c/(m·NA).
    const cocMm = 0.012; // pixel-level: 2 × a 6 µm pitch
    const plan = planStack({ ...fern, dofModel: 'wave', extensionMm: 0, baseMagnification: m, numericalAperture: na, cocMm });
    const expectedUm = waveTermUm(na) + (cocMm * 1000) / (m * na);
    expect(plan.workingFNumber).toBeCloseTo(m / (2 * na), 12);
    expect(Math.abs((plan.frameDofMm as number) * 1000 - expectedUm) / expectedUm).toBeLessThan(1e-12);
  });
});

describe('diffraction and circle of confusion', () => {
  it.each([
    // Wikipedia, "Airy disk": diameter to the first zero = 2.44·λ·N; λ = 0.55 µm.
    [8, 0, 0.55, 2.44 * 0.55 * 8],
    [8, 50, 0.55, 2.44 * 0.55 * 16], // at 1:1 the working f-number (16) sets it
    [8, 0, 0.45, 2.44 * 0.45 * 8],
  ])('f/%d, %d mm extension, λ = %d µm', (fNumber, extensionMm, wavelengthUm, expectedUm) => {
    expect(planStack({ ...fern, fNumber, extensionMm, wavelengthUm }).airyDiskUm).toBeCloseTo(expectedUm, 12);
  });

  it('sizes the circle of confusion by format and by pixel', () => {
    // common practice: c ≈ 0.029–0.03 mm for full frame, ≈ 0.019–0.02 mm for APS-C (diagonal / 1500).
    expect(cocForSensor(FULL_FRAME, 'format')).toBeGreaterThanOrEqual(0.0285);
    expect(cocForSensor(FULL_FRAME, 'format')).toBeLessThanOrEqual(0.03);
    expect(cocForSensor(APS_C_10MP, 'format')).toBeGreaterThanOrEqual(0.0185);
    expect(cocForSensor(APS_C_10MP, 'format')).toBeLessThanOrEqual(0.02);
    // Pixel level: 2 × (23.5 mm / 3872 px) = 12.1 µm.
    expect(cocForSensor(APS_C_10MP, 'pixel')).toBeCloseTo((2 * 23.5) / 3872, 12);
    expect(() => cocForSensor({ ...APS_C_10MP, pixelsAcross: 0 }, 'pixel')).toThrow(ZodError);
  });

  it('recommends f/6.3–f/7.1 on a 10 MP APS-C body at 0.5×', () => {
    // common practice: on such a body at half life size photographers stop at f/5.6–f/8; with
    // softening visible from ~2.5 px, the largest sharp ⅓ stop falls at f/6.3–f/7.1.
    const sweep = apertureSweep({ ...fern, sensor: APS_C_10MP, cocMm: cocForSensor(APS_C_10MP, 'format') });
    expect([6.3, 7.1]).toContain(sweep.recommendedFNumber);
    const row = (n: number) => sweep.rows.find((r) => r.fNumber === n);
    expect(row(sweep.recommendedFNumber)?.diffractionSoft).toBe(false);
    expect(row(8)?.diffractionSoft).toBe(true);
    expect(codes(planStack({ ...fern, sensor: APS_C_10MP, fNumber: 8 }))).toContain('diffraction-soft');
    expect(codes(planStack({ ...fern, sensor: APS_C_10MP, fNumber: 5.6 }))).not.toContain('diffraction-soft');
  });
});

describe('steps, frames and the rail', () => {
  it.each([
    [1.0, 0.1, 11],
    [1.1, 0.1, 12], // 1.1 / 0.1 = 11.000000000000002 in floating point
    [0.3, 0.1, 4], // 0.3 / 0.1 = 2.9999999999999996
    [0.7, 0.1, 8],
    [1.05, 0.1, 12],
  ])('depth %d mm at %d mm steps needs %d frames', (depthMm, stepMm, expected) => {
    // n = ⌈depth/step⌉ + 1 in exact decimal arithmetic.
    expect(framesFor(depthMm, stepMm)).toBe(expected);
  });

  it('places frames from the near limit, one step apart, past the far limit', () => {
    const plan = planStack(fern);
    const step = plan.stepMm as number;
    expect(step).toBeCloseTo((plan.frameDofMm as number) * 0.8, 12);
    expect(plan.frames).toBe(Math.ceil(4 / step) + 1);
    expect(plan.positionsMm[0]).toBe(0);
    expect(plan.positionsMm.at(-1)).toBeGreaterThanOrEqual(4);
    expect(plan.fieldWidthMm).toBeCloseTo(72, 12); // 36 mm / 0.5×
    expect(plan.fieldHeightMm).toBeCloseTo(48, 12);
  });

  it('rounds the step down to whole rail steps and recounts the frames', () => {
    const free = planStack(fern);
    const railed = planStack({ ...fern, railStepUm: 50 });
    const whole = Math.floor(((free.stepMm as number) * 1000) / 50);
    expect(railed.stepMm).toBeCloseTo((whole * 50) / 1000, 12);
    expect(railed.frames).toBe(framesFor(4, railed.stepMm as number));
    expect(railed.railSteps).toEqual(railed.positionsMm.map((_, i) => i * whole));
    expect(free.railSteps).toBeNull();
  });

  it('counts 12 frames over 1.1 mm when the rail forces 0.1 mm steps', () => {
    // frame DOF = 2·4·0.015·2 = 0.24 mm at 1:1 f/4, step 0.168 mm, rail step 100 µm → one rail step.
    const plan = planStack({ ...fern, extensionMm: 50, fNumber: 4, cocMm: 0.015, depthMm: 1.1, overlap: 0.3, railStepUm: 100 });
    expect(plan.stepMm).toBeCloseTo(0.1, 12);
    expect(plan.frames).toBe(12);
  });

  it('warns when one frame is shallower than the rail’s smallest step, and uses one step', () => {
    const plan = planStack({ ...fern, extensionMm: 150, fNumber: 2.8, cocMm: 0.01, railStepUm: 200 });
    expect(plan.frameDofMm as number).toBeLessThan(0.2);
    expect(plan.stepMm).toBeCloseTo(0.2, 12);
    expect(codes(plan)).toContain('rail-too-coarse');
  });

  it('caps the listed positions for huge stacks instead of building millions', () => {
    // A museum beetle on a microscope objective, but a whole metre of depth.
    const plan = planStack({ ...fern, dofModel: 'wave', extensionMm: 0, baseMagnification: 10, numericalAperture: 0.25, depthMm: 1000 });
    expect(plan.frames).toBeGreaterThan(10_000);
    expect(plan.positionsMm).toHaveLength(MAX_LISTED_POSITIONS);
    expect(plan.positionsTruncated).toBe(true);
    expect(codes(plan)).toContain('too-many-frames');
  });

  it('gives one frame, null depths and a warning with no magnification, and stays JSON-safe', () => {
    const plan = planStack({ ...fern, extensionMm: 0 });
    expect(plan).toMatchObject({ frames: 1, frameDofMm: null, stepMm: null, fieldWidthMm: null, positionsMm: [0] });
    expect(codes(plan)).toEqual(['no-magnification']);
    expect(JSON.parse(JSON.stringify(plan))).toEqual(plan);
    expect(stackPlanSchema.safeParse(plan).success).toBe(true);
  });
});

describe('time and vibration', () => {
  // A watch movement at 1:1: 5 frames of 1.5 s each (exposure + settle); the oiled parts creep after 6 s.
  const watch: PlanInput = { ...fern, extensionMm: 50, depthMm: 3, secondsPerFrame: 1.5, stableSeconds: 6 };

  it('adds up the shoot time and warns when it outlasts the subject', () => {
    const plan = planStack(watch);
    expect(plan.shootSeconds).toBeCloseTo(plan.frames * 1.5, 12);
    expect(plan.frames).toBe(5); // DOF 0.96 mm, step 0.768 mm → ⌈3.9⌉ + 1
    expect(codes(plan)).toContain('over-time');
    expect(codes(planStack({ ...watch, stableSeconds: 3600 }))).not.toContain('over-time');
    expect(planStack(fern).shootSeconds).toBeNull();
  });

  it.each([
    // common practice: 1/15 s to 2 s blur from shutter and floor vibration at ≥ 1×.
    [1 / 8, 50, true],
    [1, 50, true],
    [1 / 250, 50, false],
    [1 / 8, 10, false], // 0.2×
  ])('exposure %d s with %d mm of extension: vibration caution %s', (exposureTimeS, extensionMm, expected) => {
    expect(codes(planStack({ ...watch, exposureTimeS, extensionMm })).includes('vibration-risk')).toBe(expected);
  });
});

describe('aperture sweep', () => {
  it('plans one row per ⅓ stop from f/2.8 to f/22, fewer frames as it stops down', () => {
    const sweep = apertureSweep(fern);
    expect(sweep.rows.map((r) => r.fNumber)).toEqual([...THIRD_STOP_SERIES]);
    for (let i = 1; i < sweep.rows.length; i++) expect(sweep.rows[i].frames).toBeLessThanOrEqual(sweep.rows[i - 1].frames);
    expect(apertureSweepSchema.safeParse(sweep).success).toBe(true);
    expect(apertureSweep(fern, [4, 11]).rows.map((r) => r.fNumber)).toEqual([4, 11]);
  });

  it('recommends the widest aperture and warns when every one is soft', () => {
    const tinyPixels = { widthMm: 6.2, heightMm: 4.6, pixelsAcross: 6000 };
    const sweep = apertureSweep({ ...fern, extensionMm: 100, sensor: tinyPixels }, [8, 11, 16]);
    expect(sweep.recommendedFNumber).toBe(8);
    expect(codes(sweep)).toContain('all-diffraction-soft');
  });

  it('warns when even the recommended stack is over time', () => {
    const sweep = apertureSweep({ ...fern, depthMm: 40, secondsPerFrame: 5, stableSeconds: 10 });
    expect(sweep.rows.find((r) => r.fNumber === sweep.recommendedFNumber)?.overTime).toBe(true);
    expect(codes(sweep)).toContain('over-time');
  });

  it('notes that an objective’s fixed NA is set aside', () => {
    expect(codes(apertureSweep({ ...fern, numericalAperture: 0.25, extensionMm: 0, baseMagnification: 10 }))).toContain('fixed-aperture');
  });
});

describe('bad input', () => {
  const cases: [string, Record<string, unknown>, string][] = [
    ['negative focal length', { focalLengthMm: -50 }, 'focalLengthMm'],
    ['zero focal length', { focalLengthMm: 0 }, 'focalLengthMm'],
    ['NaN focal length', { focalLengthMm: NaN }, 'focalLengthMm'],
    ['focal length as a string', { focalLengthMm: '50' }, 'focalLengthMm'],
    ['infinite focal length', { focalLengthMm: Infinity }, 'focalLengthMm'],
    ['negative extension', { extensionMm: -1 }, 'extensionMm'],
    ['f-number below 0.5', { fNumber: 0.4 }, 'fNumber'],
    ['f-number above 128', { fNumber: 200 }, 'fNumber'],
    ['missing f-number', { fNumber: undefined }, 'fNumber'],
    ['zero circle of confusion', { cocMm: 0 }, 'cocMm'],
    ['negative circle of confusion', { cocMm: -0.03 }, 'cocMm'],
    ['zero depth', { depthMm: 0 }, 'depthMm'],
    ['depth over 1 m', { depthMm: 1001 }, 'depthMm'],
    ['depth as a string', { depthMm: '4 mm' }, 'depthMm'],
    ['overlap of 1', { overlap: 1 }, 'overlap'],
    ['negative overlap', { overlap: -0.1 }, 'overlap'],
    ['unknown model', { dofModel: 'fuzzy' }, 'dofModel'],
    ['fractional pixel count', { sensor: { ...FULL_FRAME, pixelsAcross: 6000.5 } }, 'sensor.pixelsAcross'],
    ['too few pixels', { sensor: { ...FULL_FRAME, pixelsAcross: 99 } }, 'sensor.pixelsAcross'],
    ['zero sensor width', { sensor: { ...FULL_FRAME, widthMm: 0 } }, 'sensor.widthMm'],
    ['wavelength in nm by mistake', { wavelengthUm: 550 }, 'wavelengthUm'],
    ['numerical aperture of 1.6', { numericalAperture: 1.6 }, 'numericalAperture'],
    ['zero numerical aperture', { numericalAperture: 0 }, 'numericalAperture'],
    ['zero rail step', { railStepUm: 0 }, 'railStepUm'],
    ['negative seconds per frame', { secondsPerFrame: -1 }, 'secondsPerFrame'],
    ['zero stable time', { stableSeconds: 0 }, 'stableSeconds'],
    ['cycle shorter than the exposure', { exposureTimeS: 2, secondsPerFrame: 1 }, 'secondsPerFrame'],
  ];

  it.each(cases)('%s is refused with the field named', (_label, patch, path) => {
    const input = { ...fern, ...patch } as PlanInput;
    const before = structuredClone(input);
    let thrown: unknown;
    try {
      planStack(input);
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(ZodError);
    expect((thrown as ZodError).issues.map((i) => i.path.join('.'))).toContain(path);
    expect(input).toEqual(before); // the caller's input is left as it was
    expect(() => apertureSweep(input)).toThrow(ZodError);
  });

  it('refuses a bad f-number list with its index named', () => {
    const error = (() => {
      try {
        apertureSweep(fern, [4, 0.2]);
      } catch (e) {
        return e as ZodError;
      }
    })();
    expect(error?.issues[0].path).toEqual(['fNumbers', 1]);
  });
});
