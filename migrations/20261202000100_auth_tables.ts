import type { Knex } from 'knex';

/**
 * better-auth's tables, exactly as its schema generator prints them for our options
 * (admin plugin, database rate limiting). tests/db/auth-schema.test.ts fails when
 * better-auth's expected schema drifts from this.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create table "user" ("id" text not null primary key, "name" text not null, "email" text not null unique,
      "emailVerified" boolean not null, "image" text, "createdAt" timestamptz default CURRENT_TIMESTAMP not null,
      "updatedAt" timestamptz default CURRENT_TIMESTAMP not null, "role" text, "banned" boolean, "banReason" text,
      "banExpires" timestamptz);
    create table "session" ("id" text not null primary key, "expiresAt" timestamptz not null, "token" text not null unique,
      "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz not null, "ipAddress" text,
      "userAgent" text, "userId" text not null references "user" ("id") on delete cascade, "impersonatedBy" text);
    create table "account" ("id" text not null primary key, "accountId" text not null, "providerId" text not null,
      "userId" text not null references "user" ("id") on delete cascade, "accessToken" text, "refreshToken" text,
      "idToken" text, "accessTokenExpiresAt" timestamptz, "refreshTokenExpiresAt" timestamptz, "scope" text,
      "password" text, "createdAt" timestamptz default CURRENT_TIMESTAMP not null, "updatedAt" timestamptz not null);
    create table "verification" ("id" text not null primary key, "identifier" text not null, "value" text not null,
      "expiresAt" timestamptz not null, "createdAt" timestamptz default CURRENT_TIMESTAMP not null,
      "updatedAt" timestamptz default CURRENT_TIMESTAMP not null);
    create table "rateLimit" ("id" text not null primary key, "key" text not null unique, "count" integer not null,
      "lastRequest" bigint not null);
    create index "session_userId_idx" on "session" ("userId");
    create index "account_userId_idx" on "account" ("userId");
    create index "verification_identifier_idx" on "verification" ("identifier");
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop table "rateLimit", "verification", "account", "session", "user"');
}
