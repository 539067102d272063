/** Invitation rows. Tokens are stored as SHA-256 hashes only. */
import { createHash } from 'node:crypto';
import type { Db } from './client';

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export type InvitationRow = {
  id: string;
  user_id: string;
  expires_at: Date;
  accepted_at: Date | null;
  revoked_at: Date | null;
};

export async function insertInvitation(
  db: Db,
  i: { userId: string; token: string; invitedBy: string; expiresAt: Date },
): Promise<string> {
  const id = crypto.randomUUID();
  await db('invitation').insert({
    id,
    user_id: i.userId,
    token_hash: hashToken(i.token),
    invited_by: i.invitedBy,
    expires_at: i.expiresAt,
  });
  return id;
}

export async function lockInvitationByToken(db: Db, token: string): Promise<InvitationRow | null> {
  const row = await db('invitation')
    .where({ token_hash: hashToken(token) })
    .forUpdate()
    .first('id', 'user_id', 'expires_at', 'accepted_at', 'revoked_at');
  return row ?? null;
}

export async function markInvitationAccepted(db: Db, id: string): Promise<void> {
  await db('invitation').where({ id }).update({ accepted_at: db.fn.now() });
}

export async function revokePendingInvitations(db: Db, userId: string): Promise<void> {
  await db('invitation')
    .where({ user_id: userId })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .update({ revoked_at: db.fn.now() });
}
