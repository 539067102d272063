/** Inviting users and accepting invitations: each a single transaction, audited, mail via the outbox. */
import { randomBytes } from 'node:crypto';
import { hashPassword } from 'better-auth/crypto';
import { passwordProblem } from '../auth/password-policy';
import { ROLE_LABELS, type Role } from '../auth/roles';
import { config } from '../config';
import { recordAudit } from '../db/audit';
import { db, withTransaction } from '../db/client';
import {
  insertInvitation,
  lockInvitationByToken,
  markInvitationAccepted,
  revokePendingInvitations,
} from '../db/invitations';
import { findUserIdByEmail, getUser, insertUser, setPassword, type UserSummary } from '../db/users';
import { HttpError } from '../http/errors';
import { INVALID_INVITATION } from '../auth/invitation-words';
import type { Caller } from '../http/handle';
import { enqueueMail } from '../mail/outbox';
import { invitationMail } from '../mail/templates';

export const INVITATION_TTL_DAYS = 7;

async function sendInvitation(
  trx: Parameters<typeof enqueueMail>[0],
  user: { id: string; name: string; email: string; roles: Role[] },
  by: Caller,
) {
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + INVITATION_TTL_DAYS * 86_400_000);
  await insertInvitation(trx, { userId: user.id, token, invitedBy: by.id, expiresAt });
  const url = `${config().BETTER_AUTH_URL}/welcome?token=${token}`;
  const roles = user.roles.map((r) => ROLE_LABELS[r]).join(', ');
  await enqueueMail(trx, {
    to: user.email,
    ...invitationMail({ name: user.name, invitedBy: by.name, roles, url, expiresDays: INVITATION_TTL_DAYS }),
  });
}

export async function inviteUser(
  by: Caller,
  input: { name: string; email: string; roles: Role[] },
): Promise<UserSummary> {
  return withTransaction(db, async (trx) => {
    if (await findUserIdByEmail(trx, input.email))
      throw new HttpError('CONFLICT', 'A user with this e-mail address already exists.');
    const id = crypto.randomUUID();
    await insertUser(trx, { id, ...input });
    await sendInvitation(trx, { id, ...input }, by);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'user.invite',
      entityType: 'user',
      entityId: id,
      details: { email: input.email, roles: input.roles },
    });
    return (await getUser(trx, id))!;
  });
}

export async function reinviteUser(by: Caller, userId: string): Promise<void> {
  await withTransaction(db, async (trx) => {
    const user = await getUser(trx, userId);
    if (!user) throw new HttpError('NOT_FOUND', 'No such user.');
    if (user.status !== 'invited')
      throw new HttpError('CONFLICT', 'This user has already set a password; use password reset instead.');
    await revokePendingInvitations(trx, userId);
    await sendInvitation(trx, user, by);
    await recordAudit(trx, { actorId: by.id, action: 'user.reinvite', entityType: 'user', entityId: userId });
  });
}

/** Sets the invitee's password. The link works once, until it expires or is replaced. */
export async function acceptInvitation(input: { token: string; password: string }): Promise<{ email: string }> {
  return withTransaction(db, async (trx) => {
    const inv = await lockInvitationByToken(trx, input.token);
    if (!inv) throw new HttpError('NOT_FOUND', INVALID_INVITATION);
    if (inv.accepted_at)
      throw new HttpError('GONE', 'This invitation link has already been used. Sign in, or reset your password.');
    if (inv.revoked_at)
      throw new HttpError('GONE', 'This invitation link was replaced by a newer one. Use the latest e-mail.');
    if (inv.expires_at.getTime() < Date.now())
      throw new HttpError('GONE', 'This invitation link has expired. Ask an administrator for a new one.');
    const user = await getUser(trx, inv.user_id);
    if (!user || user.status === 'deactivated') throw new HttpError('GONE', 'This account is no longer active.');
    const problem = passwordProblem(input.password, { email: user.email, name: user.name });
    if (problem) throw new HttpError('UNPROCESSABLE_CONTENT', problem, [{ path: ['password'], message: problem }]);
    await setPassword(trx, user.id, await hashPassword(input.password));
    await markInvitationAccepted(trx, inv.id);
    await recordAudit(trx, {
      actorId: user.id,
      action: 'user.accept-invitation',
      entityType: 'user',
      entityId: user.id,
    });
    return { email: user.email };
  });
}
