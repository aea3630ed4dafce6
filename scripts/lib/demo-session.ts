// The demo shoot: a card rendered by the synthetic stack renderer (dew drops on a leaf and a museum
// beetle), imported and sorted as a photographer would: four stacks — one with an exposure jump
// from a moved lamp, one with a skipped focus step — loose test shots, and RAW+JPEG-like pairs.
import { getDataSource } from '../../server/lib/data-source';
import { env } from '../../server/lib/env';
import { receiveBuffer } from '../../server/lib/card-upload';
import { createSession } from '../../server/services/session-service';
import { completeImport, createImport, recordUploadedFiles } from '../../server/services/card-import-service';
import { Stack } from '../../server/entities/session';
import { setStackState } from '../../server/services/stack-edit-service';
import { handOffStack } from '../../server/services/handoff-service';
import { attachMergedResult } from '../../server/services/merged-result-service';
import { DEMO_USERS } from './demo-users';
import sharp from 'sharp';
import type { Job } from 'bullmq';
import { Frame } from '../../server/entities/session';
import { framePreviewJob } from '../../worker/jobs/frame-preview';
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
  // Stacks stay unlinked: the demo plans are for other magnifications, and a link would (rightly)
  // raise a plan-mismatch check on every stack. The fern plan is linked to the session instead.
  for (const [i, stack] of stacks.entries()) {
    await ds.getRepository(Stack).update({ id: stack.id }, { name: STACK_NAMES[i] ?? stack.name });
  }
  if (fernPlan) await ds.query(`UPDATE plans SET session_id = $1 WHERE id = $2`, [session.id, fernPlan.id]);

  // The clean stacks were checked and handed to the studio's retoucher; the first came back merged.
  const who = (role: Role) => DEMO_USERS.find((u) => u.role === role)!;
  const photographer = { userId: users.photographer, label: who('photographer').name, email: who('photographer').email };
  for (const stack of [stacks[0], stacks[3]].filter(Boolean)) {
    // The seed makes these stacks' previews itself (the worker makes the rest), so the contact
    // sheets in their hand-off bundles show every frame.
    const frames = await ds.getRepository(Frame).find({ where: { stackId: stack.id }, select: { id: true } });
    for (const f of frames) {
      const job = { data: { frameId: f.id, sessionId: session.id }, updateProgress: async () => undefined } as unknown as Job<{ frameId: string; sessionId: string }>;
      await framePreviewJob(job);
    }
    await setStackState(studioId, session.id, stack.id, 'ready', photographer);
    await handOffStack(studioId, stack.id, photographer, { to: 'member', retoucherUserId: users.retoucher });
  }
  if (stacks[0]) {
    // A stand-in for the retoucher's merged picture (demo data): the stack's first frame, recompressed.
    const first = card.files.find((f) => f.stackIndex === 0 && f.kind === 'jpeg')!;
    const merged = await sharp(first.buffer).jpeg({ quality: 92 }).toBuffer();
    const received = { originalname: 'dew-on-frond-left-drop_merged.jpg', ...(await receiveBuffer(merged, env().UPLOAD_MAX_BYTES)) };
    await attachMergedResult(studioId, stacks[0].id, { userId: users.retoucher, label: who('retoucher').name }, received, { shareLinkId: null });
  }
  return { sessionId: session.id, stackIds: stacks.map((s) => s.id) };
}
