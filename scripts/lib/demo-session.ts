// The demo shoot: a card rendered by the synthetic stack renderer (dew drops on a leaf and a museum
// beetle), imported and sorted as a photographer would: four stacks — one with an exposure jump
// from a moved lamp, one with a skipped focus step — loose test shots, and RAW+JPEG-like pairs.
import { getDataSource } from '../../server/lib/data-source';
import { env } from '../../server/lib/env';
import { receiveBuffer } from '../../server/lib/card-upload';
import { createSession } from '../../server/services/session-service';
import { completeImport, createImport, recordUploadedFiles } from '../../server/services/card-import-service';
import { Stack } from '../../server/entities/session';
import { renderCard } from './stack-renderer';
import type { Role } from '../../shared/roles';

export const DEMO_SESSION_TITLE = 'Dew and beetle morning';

const STACK_NAMES = ['Dew on frond, left drop', 'Beetle elytra', 'Dew on frond, tip drop', 'Beetle head'];

export async function seedDemoSession({ studioId, users }: { studioId: string; users: Record<Role, string> }) {
  const card = await renderCard({
    seed: 7,
    widthPx: 720,
    heightPx: 480,
    stacks: [
      { frameCount: 14, scene: 'drop-on-leaf', withRaw: true, fNumber: 8, focalLengthMm: 100 },
      { frameCount: 12, scene: 'beetle', faults: { exposureJumpAt: 5 }, fNumber: 11, focalLengthMm: 100 },
      { frameCount: 12, scene: 'drop-on-leaf', faults: { skipStepAt: 6 }, fNumber: 8, focalLengthMm: 100 },
      { frameCount: 10, scene: 'beetle', fNumber: 5.6, focalLengthMm: 100 },
    ],
  });
  const session = await createSession(studioId, users.photographer, {
    title: DEMO_SESSION_TITLE,
    shootDate: '2026-05-14',
    subject: 'Dew drops on a fern frond; a pinned museum beetle',
    location: 'Studio bench and the garden bed by the north wall',
    notes: 'Hand-held lamp moved once during the beetle stack. Rail on the copy stand.',
  });
  const imp = await createImport(studioId, session.id, users.photographer, card.files.length);
  const received = await Promise.all(
    card.files.map(async (f) => ({ originalname: f.name, ...(await receiveBuffer(f.buffer, env().UPLOAD_MAX_BYTES)) })),
  );
  await recordUploadedFiles(studioId, session.id, imp.id, received as never, card.files.map((f) => f.captureTimeMs));
  await completeImport(studioId, session.id, imp.id, users.photographer);

  const ds = getDataSource();
  const stacks = await ds.getRepository(Stack).find({ where: { sessionId: session.id }, order: { position: 'ASC' } });
  const plans: { id: string; name: string }[] = await ds.query(`SELECT id, name FROM plans WHERE studio_id = $1 ORDER BY created_at`, [studioId]);
  const fernPlan = plans.find((p) => p.name.startsWith('Dew'));
  const beetlePlan = plans.find((p) => p.name.startsWith('Museum beetle'));
  for (const [i, stack] of stacks.entries()) {
    await ds.getRepository(Stack).update({ id: stack.id }, {
      name: STACK_NAMES[i] ?? stack.name,
      planId: (i % 2 === 0 ? fernPlan?.id : beetlePlan?.id) ?? null,
    });
  }
  if (fernPlan) await ds.query(`UPDATE plans SET session_id = $1 WHERE id = $2`, [session.id, fernPlan.id]);
  return { sessionId: session.id, stackIds: stacks.map((s) => s.id) };
}
