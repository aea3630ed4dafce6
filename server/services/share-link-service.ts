// Share links for outside retouchers: an unguessable 256-bit token (only its SHA-256 is stored),
// an expiry of 1–30 days, a download count, and revocation. Every use checks all of it.
import { IsNull, type EntityManager } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { Gone, NotFound } from '../lib/errors';
import { hashToken, newLinkToken } from '../lib/tokens';
import { ShareLink } from '../entities/handoff';
import { ShootSession, Stack } from '../entities/session';
import { Studio } from '../entities/studio';
import type { NewShareLink, ShareLinkView } from '../../shared/schemas/handoff';
import { DAY_MS, shareUrl, utcText } from './handoff-steps';

// newLinkToken: 32 random bytes in base64url, 43 characters.
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

export function shareLinkView(link: ShareLink, now = Date.now()): ShareLinkView {
  return {
    id: link.id,
    email: link.email,
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt.toISOString(),
    revokedAt: link.revokedAt?.toISOString() ?? null,
    downloadCount: link.downloadCount,
    lastDownloadAt: link.lastDownloadAt?.toISOString() ?? null,
    status: link.revokedAt ? 'revoked' : link.expiresAt.getTime() <= now ? 'expired' : 'active',
  };
}

export async function issueShareLink(
  tx: EntityManager,
  input: { studioId: string; stackId: string; email: string; expiryDays: number; createdBy: string },
): Promise<{ link: ShareLink; shown: NewShareLink; token: string }> {
  const { token, tokenHash } = newLinkToken();
  const repo = tx.getRepository(ShareLink);
  const link = await repo.save(repo.create({
    studioId: input.studioId,
    stackId: input.stackId,
    email: input.email,
    tokenHash,
    expiresAt: new Date(Date.now() + input.expiryDays * DAY_MS),
    revokedAt: null,
    downloadCount: 0,
    lastDownloadAt: null,
    createdBy: input.createdBy,
  }));
  return { link, token, shown: { ...shareLinkView(link), url: shareUrl(token) } };
}

export async function linksOfStack(stackId: string): Promise<ShareLinkView[]> {
  const links = await getDataSource().getRepository(ShareLink).find({ where: { stackId }, order: { createdAt: 'DESC' } });
  return links.map((l) => shareLinkView(l));
}

/** Revokes every live link of a stack (taking a hand-off back); answers how many. */
export async function revokeLinksOfStack(tx: EntityManager, stackId: string): Promise<number> {
  const res = await tx.getRepository(ShareLink).update({ stackId, revokedAt: IsNull() }, { revokedAt: new Date() });
  return res.affected ?? 0;
}

export interface OpenedLink {
  link: ShareLink;
  stack: Stack;
  session: ShootSession;
  studio: Studio;
}

/**
 * The link behind a token, refused unless it is live: unknown (guessed, mistyped) and links whose
 * stack is not in the link's studio answer 404; revoked, expired and finished hand-offs 410.
 */
export async function openShareLink(token: string): Promise<OpenedLink> {
  const unknown = new NotFound('No share link matches this address. Check that the whole link was copied, or ask the studio for a new one.');
  if (!TOKEN_SHAPE.test(token)) throw unknown;
  const ds = getDataSource();
  const link = await ds.getRepository(ShareLink).findOneBy({ tokenHash: hashToken(token) });
  if (!link) throw unknown;
  const stack = await ds.getRepository(Stack).findOneBy({ id: link.stackId });
  const session = stack ? await ds.getRepository(ShootSession).findOneBy({ id: stack.sessionId, studioId: link.studioId }) : null;
  const studio = session ? await ds.getRepository(Studio).findOneBy({ id: link.studioId }) : null;
  if (!stack || !session || !studio) throw unknown;
  if (link.revokedAt) throw new Gone(`${studio.name} withdrew this share link on ${utcText(link.revokedAt)}. Ask them for a new one if you still need the frames.`);
  if (link.expiresAt.getTime() <= Date.now()) throw new Gone(`This share link expired on ${utcText(link.expiresAt)}. Ask ${studio.name} for a new one.`);
  const stillYours = stack.handedToEmail === link.email && (stack.state === 'handed-off' || stack.state === 'merged');
  if (!stillYours) throw new Gone(`The hand-off of “${stack.name}” is finished; this link no longer opens it.`);
  return { link, stack, session, studio };
}

/** Counts one download of the bundle through this link; answers the new count. */
export async function countShareDownload(linkId: string): Promise<number> {
  // TypeORM answers an UPDATE … RETURNING on PostgreSQL as [rows, affected].
  const [rows]: [{ download_count: number }[], number] = await getDataSource().query(
    `UPDATE share_links SET download_count = download_count + 1, last_download_at = now() WHERE id = $1 RETURNING download_count`,
    [linkId],
  );
  return rows[0].download_count;
}
