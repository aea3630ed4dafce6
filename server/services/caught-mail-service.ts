import { getDataSource } from '../lib/data-source';

/** Mail caught by the local mail catcher, addressed to this studio's members or invitees. */
export async function listCaughtMail(studioId: string) {
  const rows: { id: string; from_address: string; to_addresses: string[]; subject: string; text_body: string; received_at: Date }[] =
    await getDataSource().query(
      `SELECT c.* FROM caught_mail c
        WHERE c.to_addresses && ((
          SELECT coalesce(array_agg(u.email), '{}') FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.studio_id = $1
        ) || (SELECT coalesce(array_agg(i.email), '{}') FROM invitations i WHERE i.studio_id = $1))
        ORDER BY c.received_at DESC LIMIT 100`,
      [studioId],
    );
  return rows.map((r) => ({
    id: r.id,
    from: r.from_address,
    to: r.to_addresses,
    subject: r.subject,
    text: r.text_body,
    receivedAt: new Date(r.received_at).toISOString(),
  }));
}

export async function storeCaughtMail(mail: { from: string; to: string[]; subject: string; text: string }) {
  await getDataSource().query(
    `INSERT INTO caught_mail (from_address, to_addresses, subject, text_body) VALUES ($1, $2, $3, $4)`,
    [mail.from, mail.to.map((t) => t.toLowerCase()), mail.subject, mail.text],
  );
}
