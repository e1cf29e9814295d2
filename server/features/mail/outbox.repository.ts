import { db, type Db, type DevOutboxRow } from '../../lib/db.ts';

export async function insertCaughtMessage(message: Omit<DevOutboxRow, 'id' | 'sent_at'>, trx: Db = db): Promise<void> {
  await trx('dev_outbox').insert(message);
}

export async function listCaughtMessages(limit = 200, trx: Db = db) {
  const rows = await trx('dev_outbox').orderBy('sent_at', 'desc').limit(limit);
  return rows.map((r) => ({
    id: r.id,
    to: r.to,
    subject: r.subject,
    text: r.text,
    html: r.html,
    headers: r.headers,
    sent_at: r.sent_at.toISOString(),
  }));
}
