/**
 * The better-auth instance (server-only). Sessions, verification tokens and rate-limit
 * counters all live in PostgreSQL, so any number of app instances can share them.
 * There is no self-sign-up: admins invite (see lib/services/invitations.ts).
 */
import { betterAuth } from 'better-auth';
import { APIError, createAuthMiddleware } from 'better-auth/api';
import { admin } from 'better-auth/plugins';
import { createAccessControl } from 'better-auth/plugins/access';
import { adminAc, defaultStatements } from 'better-auth/plugins/admin/access';
import pg from 'pg';
import { config } from '../config';
import { enqueueMail } from '../mail/outbox';
import { db } from '../db/client';
import { passwordResetMail } from '../mail/templates';
import { recordAudit } from '../db/audit';
import { passwordProblem, PASSWORD_MAX, PASSWORD_MIN } from './password-policy';
import { clearSignInFailures } from './throttle';

const ac = createAccessControl({ ...defaultStatements, register: ['read', 'file', 'assess', 'decide'] } as const);

const roles = {
  planner: ac.newRole({ register: ['read', 'file'] }),
  assessor: ac.newRole({ register: ['read', 'assess'] }),
  board: ac.newRole({ register: ['read', 'decide'] }),
  chair: ac.newRole({ register: ['read', 'decide'] }),
  admin: ac.newRole({ ...adminAc.statements, register: ['read', 'file', 'assess', 'decide'] }),
};

const cfg = config();
export const RESET_TOKEN_TTL_S = 60 * 60;
/** Absolute session lifetime; the idle timeout (app setting, see lib/auth/session-idle.ts) ends it sooner. */
export const SESSION_MAX_AGE_S = 60 * 60 * 24 * 7;

/** better-auth endpoints that set a password: the one policy applies to every one of them. */
const SETS_PASSWORD: Record<string, (body: Record<string, unknown>) => unknown> = {
  '/reset-password': (b) => b.newPassword,
  '/change-password': (b) => b.newPassword,
  '/admin/set-user-password': (b) => b.newPassword,
  '/set-password': (b) => b.newPassword,
  '/sign-up/email': (b) => b.password,
  '/admin/create-user': (b) => b.password,
};

const passwordPolicy = createAuthMiddleware(async (ctx) => {
  const pick = SETS_PASSWORD[ctx.path];
  if (!pick || !ctx.body) return;
  const password = pick(ctx.body as Record<string, unknown>);
  if (typeof password !== 'string') return;
  let who: { email?: string; name?: string } = {};
  const token = (ctx.body as { token?: unknown }).token;
  if (ctx.path === '/reset-password' && typeof token === 'string') {
    const v = await ctx.context.internalAdapter.findVerificationValue(`reset-password:${token}`);
    const user = v ? await ctx.context.internalAdapter.findUserById(v.value) : null;
    if (user) who = { email: user.email, name: user.name };
  }
  const problem = passwordProblem(password, who);
  if (problem) throw new APIError('BAD_REQUEST', { code: 'PASSWORD_TOO_WEAK', message: problem });
});

export const auth = betterAuth({
  appName: 'Swardkeep',
  database: new pg.Pool({ connectionString: cfg.DATABASE_URL, max: 4 }),
  secret: cfg.BETTER_AUTH_SECRET,
  baseURL: cfg.BETTER_AUTH_URL,
  telemetry: { enabled: false },
  emailAndPassword: {
    enabled: true,
    disableSignUp: true,
    minPasswordLength: PASSWORD_MIN,
    maxPasswordLength: PASSWORD_MAX,
    resetPasswordTokenExpiresIn: RESET_TOKEN_TTL_S,
    revokeSessionsOnPasswordReset: true,
    sendResetPassword: async ({ user, url }) => {
      await enqueueMail(db, { to: user.email, ...passwordResetMail({ name: user.name, url }) });
    },
    // The owner proved control of the mailbox: earlier failed guesses no longer delay them.
    onPasswordReset: async ({ user }) => clearSignInFailures(db, user.email),
  },
  session: { expiresIn: SESSION_MAX_AGE_S, updateAge: 60 * 60 * 24 },
  hooks: { before: passwordPolicy },
  rateLimit: {
    enabled: cfg.AUTH_RATE_LIMIT === 'on',
    storage: 'database',
    window: 60,
    max: 100,
    // Coarse flood limits per client address (the trusted one: see scripts/serve.mjs), high enough
    // for an office behind one address. Failed sign-ins are throttled per account and per address
    // with back-off, and reset mails per account, in lib/auth/throttle.ts.
    customRules: {
      '/sign-in/email': { window: cfg.AUTH_SIGNIN_WINDOW_S, max: cfg.AUTH_SIGNIN_MAX },
      '/request-password-reset': { window: 300, max: 20 },
      '/reset-password': { window: 300, max: 20 },
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
      create: {
        after: async (session) =>
          recordAudit(db, {
            actorId: session.userId,
            action: 'user.sign-in',
            entityType: 'user',
            entityId: session.userId,
            details: { ip: session.ipAddress ?? null },
          }),
      },
    },
    account: {
      update: {
        after: async (account) => {
          if (account.providerId === 'credential')
            await recordAudit(db, {
              actorId: account.userId,
              action: 'user.password-reset',
              entityType: 'user',
              entityId: account.userId,
            });
        },
      },
    },
  },
  plugins: [admin({ ac, roles, defaultRole: 'planner', adminRoles: ['admin'] })],
});

export type Session = typeof auth.$Infer.Session;
