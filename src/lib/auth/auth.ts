/**
 * The better-auth instance (server-only). Sessions, verification tokens and rate-limit
 * counters all live in PostgreSQL, so any number of app instances can share them.
 * There is no self-sign-up: admins invite (see lib/services/invitations.ts).
 */
import { betterAuth } from 'better-auth';
import { admin } from 'better-auth/plugins';
import { createAccessControl } from 'better-auth/plugins/access';
import { adminAc, defaultStatements } from 'better-auth/plugins/admin/access';
import pg from 'pg';
import { config } from '../config';
import { enqueueMail } from '../mail/outbox';
import { db } from '../db/client';
import { passwordResetMail } from '../mail/templates';
import { recordAudit } from '../db/audit';

const ac = createAccessControl({ ...defaultStatements, register: ['read', 'file', 'assess', 'decide'] } as const);

const roles = {
  planner: ac.newRole({ register: ['read', 'file'] }),
  assessor: ac.newRole({ register: ['read', 'assess'] }),
  board: ac.newRole({ register: ['read', 'decide'] }),
  chair: ac.newRole({ register: ['read', 'decide'] }),
  admin: ac.newRole({ ...adminAc.statements, register: ['read', 'file', 'assess', 'decide'] }),
};

const cfg = config();
export const MIN_PASSWORD_LENGTH = 10;
export const RESET_TOKEN_TTL_S = 60 * 60;

export const auth = betterAuth({
  appName: 'Swardkeep',
  database: new pg.Pool({ connectionString: cfg.DATABASE_URL, max: 4 }),
  secret: cfg.BETTER_AUTH_SECRET,
  baseURL: cfg.BETTER_AUTH_URL,
  telemetry: { enabled: false },
  emailAndPassword: {
    enabled: true,
    disableSignUp: true,
    minPasswordLength: MIN_PASSWORD_LENGTH,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: RESET_TOKEN_TTL_S,
    revokeSessionsOnPasswordReset: true,
    sendResetPassword: async ({ user, url }) => {
      await enqueueMail(db, { to: user.email, ...passwordResetMail({ name: user.name, url }) });
    },
  },
  session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
  rateLimit: {
    enabled: cfg.AUTH_RATE_LIMIT === 'on',
    storage: 'database',
    window: 60,
    max: 100,
    customRules: {
      '/sign-in/email': { window: cfg.AUTH_SIGNIN_WINDOW_S, max: cfg.AUTH_SIGNIN_MAX },
      '/request-password-reset': { window: 300, max: 5 },
      '/reset-password': { window: 300, max: 10 },
    },
  },
  advanced: {
    ipAddress: { ipAddressHeaders: ['x-client-ip'] },
    useSecureCookies: cfg.BETTER_AUTH_URL.startsWith('https://'),
    defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' },
  },
  // Sign-ins and password changes go into the audit log like every other change.
  databaseHooks: {
    session: {
      create: { after: async (session) => recordAudit(db, { actorId: session.userId, action: 'user.sign-in', entityType: 'user', entityId: session.userId, details: { ip: session.ipAddress ?? null } }) },
    },
    account: {
      update: {
        after: async (account) => {
          if (account.providerId === 'credential') await recordAudit(db, { actorId: account.userId, action: 'user.password-reset', entityType: 'user', entityId: account.userId });
        },
      },
    },
  },
  plugins: [admin({ ac, roles, defaultRole: 'planner', adminRoles: ['admin'] })],
});

export type Session = typeof auth.$Infer.Session;
