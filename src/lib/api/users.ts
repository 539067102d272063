/** Contracts of the user-management and invitation routes. */
import { z } from 'zod';
import { ROLES } from '../auth/roles';
import { defineSpec } from '../http/spec';

import { INVALID_INVITATION } from '../auth/invitation-words';
const roleSchema = z.enum(ROLES);
export const userSchema = z
  .object({
    id: z.string(),
    name: z.string(),
    email: z.string(),
    roles: z.array(roleSchema),
    status: z.enum(['invited', 'active', 'deactivated']),
    createdAt: z.string(),
    version: z
      .number()
      .int()
      .describe('Row version; send it back with a change (409 when someone changed the user meanwhile)'),
  })
  .meta({ id: 'User' });

const idParams = z.object({ id: z.string().min(1).max(100) });

export const inviteInputSchema = z.object({
  name: z.string().trim().min(2, 'Give the person’s name.').max(120),
  email: z.email('Give a valid e-mail address.').max(200),
  roles: z.array(roleSchema).min(1, 'Choose at least one role.'),
});

export const listUsers = defineSpec({
  method: 'GET',
  path: '/api/users',
  tag: 'Users',
  summary: 'List users',
  access: ['admin'],
  response: z.object({ items: z.array(userSchema) }),
});

export const inviteUser = defineSpec({
  method: 'POST',
  path: '/api/users',
  tag: 'Users',
  summary: 'Invite a user by e-mail',
  access: ['admin'],
  body: inviteInputSchema,
  response: userSchema,
  status: 201,
});

export const updateUser = defineSpec({
  method: 'PATCH',
  path: '/api/users/{id}',
  tag: 'Users',
  summary: 'Change a user’s name, roles or active status',
  access: ['admin'],
  params: idParams,
  body: z
    .object({
      version: z.number().int().min(1),
      name: z.string().trim().min(2).max(120).optional(),
      roles: z.array(roleSchema).min(1).optional(),
      active: z.boolean().optional(),
    })
    .refine((v) => Object.keys(v).length > 1, 'Change at least one field.'),
  response: userSchema,
});

export const reinviteUser = defineSpec({
  method: 'POST',
  path: '/api/users/{id}/invitation',
  tag: 'Users',
  summary: 'Send a new invitation link (the old one stops working)',
  access: ['admin'],
  params: idParams,
  response: null,
  status: 204,
});

export const acceptInvitation = defineSpec({
  method: 'POST',
  path: '/api/invitations/accept',
  tag: 'Users',
  summary: 'Set a password from an invitation link',
  access: 'public',
  // A cut-off or garbled link gets the same words as an unknown one, not a schema message.
  body: z.object({
    token: z.string(INVALID_INVITATION).min(10, INVALID_INVITATION).max(200, INVALID_INVITATION),
    password: z.string().max(200),
  }),
  response: z.object({ email: z.string() }),
});

export const me = defineSpec({
  method: 'GET',
  path: '/api/me',
  tag: 'Users',
  summary: 'The signed-in user and roles',
  access: 'signed-in',
  response: z.object({ id: z.string(), name: z.string(), email: z.string(), roles: z.array(roleSchema) }),
});
