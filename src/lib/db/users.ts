/** Users as Swardkeep sees them (better-auth owns the tables; we read and update roles and status). */
import { formatRoles, parseRoles, type Role } from '../auth/roles';
import type { Db } from './client';

export type UserStatus = 'invited' | 'active' | 'deactivated';
export type UserSummary = {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  status: UserStatus;
  createdAt: string;
  version: number;
};

type Row = {
  id: string;
  name: string;
  email: string;
  role: string | null;
  banned: boolean | null;
  createdAt: Date;
  has_password: boolean;
  version: number;
};

function toSummary(r: Row): UserSummary {
  const status: UserStatus = r.banned ? 'deactivated' : r.has_password ? 'active' : 'invited';
  return {
    id: r.id,
    name: r.name,
    email: r.email,
    roles: parseRoles(r.role),
    status,
    createdAt: r.createdAt.toISOString(),
    version: r.version,
  };
}

function baseQuery(db: Db) {
  return db('user as u').select(
    'u.id',
    'u.name',
    'u.email',
    'u.role',
    'u.banned',
    'u.createdAt',
    'u.version',
    db.raw(
      `exists (select 1 from account a where a."userId" = u.id and a."providerId" = 'credential' and a.password is not null) as has_password`,
    ),
  );
}

export async function listUsers(db: Db): Promise<UserSummary[]> {
  const rows: Row[] = await baseQuery(db).orderBy('u.name');
  return rows.map(toSummary);
}

export async function getUser(db: Db, id: string): Promise<UserSummary | null> {
  const row: Row | undefined = await baseQuery(db).where('u.id', id).first();
  return row ? toSummary(row) : null;
}

export async function findUserIdByEmail(db: Db, email: string): Promise<string | null> {
  const row = await db('user').whereRaw('lower(email) = lower(?)', [email]).first('id');
  return row?.id ?? null;
}

export async function insertUser(db: Db, u: { id: string; name: string; email: string; roles: Role[] }): Promise<void> {
  await db('user').insert({
    id: u.id,
    name: u.name,
    email: u.email.toLowerCase(),
    emailVerified: false,
    role: formatRoles(u.roles),
    banned: false,
  });
}

/** Applies an administrator's change when the row is still at `version`; false when someone changed it meanwhile. */
export async function updateUser(
  db: Db,
  id: string,
  version: number,
  patch: { name?: string; roles?: Role[]; active?: boolean },
): Promise<boolean> {
  const values: Record<string, unknown> = { updatedAt: db.fn.now(), version: db.raw('version + 1') };
  if (patch.name !== undefined) values.name = patch.name;
  if (patch.roles !== undefined) values.role = formatRoles(patch.roles);
  if (patch.active !== undefined) {
    values.banned = !patch.active;
    values.banReason = patch.active ? null : 'Deactivated by an administrator';
  }
  return (await db('user').where({ id, version }).update(values)) === 1;
}

export async function deleteSessionsOf(db: Db, userId: string): Promise<void> {
  await db('session').where({ userId }).delete();
}

export async function setPassword(db: Db, userId: string, passwordHash: string): Promise<void> {
  const existing = await db('account').where({ userId, providerId: 'credential' }).first('id');
  if (existing) {
    await db('account').where({ id: existing.id }).update({ password: passwordHash, updatedAt: db.fn.now() });
  } else {
    await db('account').insert({
      id: crypto.randomUUID(),
      accountId: userId,
      providerId: 'credential',
      userId,
      password: passwordHash,
      updatedAt: db.fn.now(),
    });
  }
  await db('user').where({ id: userId }).update({ emailVerified: true, updatedAt: db.fn.now() });
}

export async function countAdmins(db: Db): Promise<number> {
  const r = await db('user')
    .where('role', 'like', '%admin%')
    .andWhere((q) => q.whereNull('banned').orWhere('banned', false))
    .count<{ count: number }[]>('* as count');
  return Number(r[0]?.count ?? 0);
}

/** The e-mail address a still-valid password-reset token belongs to (better-auth keeps it as `reset-password:<token>` → user id). */
export async function emailForResetToken(db: Db, token: string): Promise<string | null> {
  const row = await db('verification as v')
    .join('user as u', 'u.id', 'v.value')
    .where('v.identifier', `reset-password:${token}`)
    .andWhere('v.expiresAt', '>', db.fn.now())
    .first('u.email');
  return row?.email ?? null;
}
