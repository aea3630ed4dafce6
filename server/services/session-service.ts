import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { ShootSession } from '../entities/session';
import type { SessionCreate } from '../../shared/schemas/sessions';
import type { SessionRow } from '../../shared/schemas/session-views';


/** A session of this studio, or 404 (never another studio's: ids are checked against the studio). */
export async function sessionInStudio(studioId: string, sessionId: string): Promise<ShootSession> {
  const s = /^[0-9a-f-]{36}$/i.test(sessionId)
    ? await getDataSource().getRepository(ShootSession).findOneBy({ id: sessionId, studioId })
    : null;
  if (!s) throw new NotFound('No such session in this studio.');
  return s;
}

export async function listSessions(studioId: string): Promise<SessionRow[]> {
  const rows: Record<string, unknown>[] = await getDataSource().query(
    `SELECT s.id, s.title, s.shoot_date::text AS shoot_date, s.subject, s.location, s.notes, s.updated_at,
            (SELECT count(*) FROM frames f WHERE f.session_id = s.id)::int AS frame_count,
            (SELECT count(*) FROM stacks k WHERE k.session_id = s.id)::int AS stack_count,
            (SELECT count(*) FROM frames f WHERE f.session_id = s.id AND f.stack_id IS NULL)::int AS loose_count
       FROM shoot_sessions s WHERE s.studio_id = $1 ORDER BY s.shoot_date DESC, s.created_at DESC`,
    [studioId],
  );
  return rows.map((r) => ({
    id: String(r.id),
    title: String(r.title),
    shootDate: String(r.shoot_date),
    subject: String(r.subject),
    location: String(r.location),
    notes: String(r.notes),
    frameCount: Number(r.frame_count),
    stackCount: Number(r.stack_count),
    looseCount: Number(r.loose_count),
    updatedAt: new Date(r.updated_at as string).toISOString(),
  }));
}

export async function getSessionRow(studioId: string, sessionId: string): Promise<SessionRow> {
  await sessionInStudio(studioId, sessionId);
  const row = (await listSessions(studioId)).find((s) => s.id === sessionId);
  if (!row) throw new NotFound('No such session in this studio.');
  return row;
}

export async function createSession(studioId: string, userId: string, input: SessionCreate): Promise<SessionRow> {
  const repo = getDataSource().getRepository(ShootSession);
  const saved = await repo.save(repo.create({ ...input, studioId, createdBy: userId, groupingOptions: {} }));
  return getSessionRow(studioId, saved.id);
}

export async function updateSession(studioId: string, sessionId: string, input: Partial<SessionCreate>): Promise<SessionRow> {
  await sessionInStudio(studioId, sessionId);
  await getDataSource().getRepository(ShootSession).update({ id: sessionId, studioId }, { ...input, updatedAt: new Date() });
  return getSessionRow(studioId, sessionId);
}

/** Owners only (checked by the route). Removes the session's rows; stored files go with the folder. */
export async function deleteSession(studioId: string, sessionId: string): Promise<void> {
  await sessionInStudio(studioId, sessionId);
  await getDataSource().getRepository(ShootSession).delete({ id: sessionId, studioId });
}
