/** The OpenAPI document and the one error shape. */
import { describe, expect, it } from 'vitest';
import { allSpecs } from '~/lib/api';
import { api, DEMO, signIn } from '../support/http';

describe('OpenAPI document', () => {
  it('is served publicly and describes every route with its method', async () => {
    const res = await api('GET', '/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    for (const s of allSpecs)
      expect(res.body.paths[s.path]?.[s.method.toLowerCase()], `${s.method} ${s.path}`).toBeTruthy();
    expect(res.body.components.schemas.Error).toBeTruthy();
  });

  it('carries the zod-derived request schema (invite requires name, email, roles)', async () => {
    const res = await api('GET', '/api/openapi.json');
    const schema = res.body.paths['/api/users'].post.requestBody.content['application/json'].schema;
    expect(schema.required).toEqual(expect.arrayContaining(['name', 'email', 'roles']));
  });
});

describe('error shape', () => {
  it('malformed JSON is a 400, a wrong content type a 415, a bad field a 422 naming the field', async () => {
    const admin = await signIn(DEMO.admin);
    const bad = await api('POST', '/api/users', {
      session: admin,
      body: '{not json',
      headers: { 'content-type': 'application/json' },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error).toEqual({ code: 'BAD_REQUEST', message: 'The request body is not valid JSON.' });
    const type = await api('POST', '/api/users', {
      session: admin,
      body: 'name=x',
      headers: { 'content-type': 'text/plain' },
    });
    expect(type.status).toBe(415);
    const field = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Al Bee', email: 'not-an-address', roles: ['planner'] },
    });
    expect(field.status).toBe(422);
    expect(field.body.error.issues[0].path).toEqual(['email']);
    expect(field.body.error.message).toMatch(/email/);
  });

  it('an unknown record is a 404 in the same shape', async () => {
    const admin = await signIn(DEMO.admin);
    const res = await api('PATCH', '/api/users/no-such-user', {
      session: admin,
      body: { version: 1, name: 'Someone Else' },
    });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('NOT_FOUND');
  });
});
