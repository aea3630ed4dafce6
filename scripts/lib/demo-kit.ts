// The demo studio's kit and three plans from our own scenario: dew on a fern frond at 0.5×,
// a watch movement at 1×, a museum beetle at 3×. Bodies are named by format only.
import { createKitItem } from '../../server/services/kit-service';
import { createPlan } from '../../server/services/plan-service';
import { cocForSensor } from '../../shared/optics';
import type { Role } from '../../shared/roles';
import type { PlanInput } from '../../shared/schemas/plan-input';
import type { PlanSaveInput } from '../../shared/schemas/plan';

export async function seedDemoKitAndPlans({ studioId, users }: { studioId: string; users: Record<Role, string> }): Promise<void> {
  const fullFrame = await createKitItem(studioId, 'bodies', { name: 'Full-frame body', sensorFormat: 'full-frame', pixelsAcross: 6000 });
  const apsC = await createKitItem(studioId, 'bodies', { name: 'APS-C body (10 MP)', sensorFormat: 'aps-c-23.5', pixelsAcross: 3872 });
  const normal = await createKitItem(studioId, 'lenses', { name: '50 mm lens', focalLengthMm: 50, widestFNumber: 1.8, narrowestFNumber: 22, maxMagnification: 0.15 });
  const macro = await createKitItem(studioId, 'lenses', { name: '100 mm 1:1 macro lens', focalLengthMm: 100, widestFNumber: 2.8, narrowestFNumber: 32, maxMagnification: 1, pupilMagnification: 0.6 });
  const tubes = await createKitItem(studioId, 'extension-sets', { name: 'Tube set', tubeLengthsMm: [12, 20, 36] });
  const longTubes = await createKitItem(studioId, 'extension-sets', { name: 'Long tubes', tubeLengthsMm: [25, 50, 75] });
  const rail = await createKitItem(studioId, 'rails', { name: 'Focusing rail', travelMm: 50, smallestStepUm: 5 });

  const sensorOf = (b: typeof fullFrame) => ({ widthMm: b.sensorWidthMm, heightMm: b.sensorHeightMm, pixelsAcross: b.pixelsAcross });
  const onRail = { railStepUm: rail.smallestStepUm, dofModel: 'geometric' as const, overlap: 0.2 };

  // Dew evaporates within minutes: the 50 mm lens focused close (0.1×) plus the 20 mm tube gives 0.5×.
  const fern: PlanInput = {
    ...onRail, focalLengthMm: 50, baseMagnification: 0.1, extensionMm: 20, fNumber: 7.1,
    cocMm: cocForSensor(sensorOf(apsC), 'format'), sensor: sensorOf(apsC), depthMm: 4,
    secondsPerFrame: 3, exposureTimeS: 1 / 125, stableSeconds: 240,
  };
  // A still subject: the macro lens at its own 1:1, no tubes.
  const watch: PlanInput = {
    ...onRail, focalLengthMm: 100, baseMagnification: 1, pupilMagnification: 0.6, extensionMm: 0, fNumber: 5.6,
    cocMm: cocForSensor(sensorOf(fullFrame), 'format'), sensor: sensorOf(fullFrame), depthMm: 3,
    secondsPerFrame: 2, exposureTimeS: 1 / 200, stableSeconds: 3600,
  };
  // A pinned specimen: the 50 mm lens at infinity on all three long tubes (150 mm) gives 3×.
  const beetle: PlanInput = {
    ...onRail, focalLengthMm: 50, extensionMm: 150, fNumber: 2.8,
    cocMm: cocForSensor(sensorOf(fullFrame), 'pixel'), sensor: sensorOf(fullFrame), depthMm: 5,
    secondsPerFrame: 4, exposureTimeS: 1 / 160, stableSeconds: 7200,
  };

  const plans: PlanSaveInput[] = [
    {
      name: 'Dew on a fern frond (0.5×)', inputs: fern, focusingMethod: 'rail',
      notes: 'Shoot before the sun reaches the frond; the drops shrink within minutes.',
      kit: { bodyId: apsC.id, lensId: normal.id, extensionSetId: tubes.id, tubeIndexes: [1], railId: rail.id },
    },
    {
      name: 'Watch movement (1×)', inputs: watch, focusingMethod: 'rail',
      notes: 'Balance wheel stopped; bridge screws to the jewel in one stack.',
      kit: { bodyId: fullFrame.id, lensId: macro.id, extensionSetId: null, tubeIndexes: [], railId: rail.id },
    },
    {
      name: 'Museum beetle (3×)', inputs: beetle, focusingMethod: 'rail',
      notes: 'Pinned specimen from the teaching collection; cool light only.',
      kit: { bodyId: fullFrame.id, lensId: normal.id, extensionSetId: longTubes.id, tubeIndexes: [0, 1, 2], railId: rail.id },
    },
  ];
  for (const plan of plans) await createPlan(studioId, users.photographer, plan);
}
