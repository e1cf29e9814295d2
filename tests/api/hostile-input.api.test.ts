import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { signUpThroughMail } from '../support/sign-up.ts';
import { signedInAgent, testApp } from '../support/test-app.ts';

// Strings that break naive SQL building; Knex binds parameters, so they must be stored verbatim.
const SQL_METACHARACTERS = ["Robert'); DROP TABLE users;--", `" OR 1=1 --`, '\\x00; select pg_sleep(5)', '%_\\%'];

describe('hostile and malformed input', () => {
  it('malformed JSON responds 400 with a sentence', async () => {
    const res = await request(testApp()).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: 'The request body is not valid JSON.', code: 'malformed-json' });
  });

  it('a 10 MB JSON body responds 413 and creates nothing', async () => {
    const huge = JSON.stringify({
      email: 'big@example.test',
      password: 'a long enough secret',
      role: 'runner',
      name: 'x'.repeat(10 * 1024 * 1024),
    });
    const res = await request(testApp()).post('/api/auth/register').set('Content-Type', 'application/json').send(huge);
    expect(res.status).toBe(413);
    expect(res.body.code).toBe('too-large');
    expect(await db('users').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('a JSON array or a string instead of an object responds 400', async () => {
    for (const body of ['[]', '"hello"', 'null']) {
      const res = await request(testApp()).post('/api/auth/register').set('Content-Type', 'application/json').send(body);
      expect(res.status).toBe(400);
    }
  });

  it('unknown fields are refused (400), not silently stored', async () => {
    const res = await request(testApp())
      .post('/api/auth/register')
      .send({ email: 'extra@example.test', password: 'a long enough secret', name: 'X', role: 'runner', is_admin: true });
    expect(res.status).toBe(400);
    expect(res.body.details[0].message).toMatch(/Unknown field: is_admin/);
  });

  it.each(SQL_METACHARACTERS)('SQL metacharacters in every text field are stored and read back verbatim: %s', async (nasty) => {
    const app = testApp();
    const { answer: register } = await signUpThroughMail(app, {
      email: 'meta@example.test',
      password: `${nasty} padding`,
      name: nasty,
      role: 'runner',
    });
    expect(register.status).toBe(201);
    expect(register.body.user.name).toBe(nasty.trim());
    const login = await request(app)
      .post('/api/auth/login')
      .send({ email: 'meta@example.test', password: `${nasty} padding` });
    expect(login.status).toBe(200);
    const badLogin = await request(app)
      .post('/api/auth/login')
      .send({ email: `${nasty}@x.test`, password: nasty });
    expect([400, 401]).toContain(badLogin.status);
    const token = (
      await request(app)
        .post('/api/auth/token')
        .send({ email: 'meta@example.test', password: `${nasty} padding` })
    ).body.token;
    // Named tokens are made from the website session only (issue 13 #12).
    const browser = await signedInAgent(app, 'meta@example.test', `${nasty} padding`);
    const named = await browser.agent.post('/api/auth/tokens').set(CSRF_HEADER, browser.csrf).send({ name: nasty });
    expect(named.status).toBe(201);
    expect(named.body.name).toBe(nasty.trim());
    const tz = await request(app).patch('/api/me').set('Authorization', `Bearer ${token}`).send({ time_zone: nasty });
    expect(tz.status).toBe(400);
    expect(await db('users').count({ n: '*' }).first()).toEqual({ n: '1' });
  });

  it('an unknown API route responds 404 JSON; the server keeps answering', async () => {
    const app = testApp();
    const res = await request(app).get('/api/no/such/thing');
    expect(res.status).toBe(404);
    expect(res.body.code).toBe('not-found');
    expect((await request(app).get('/api/health')).body).toEqual({ ok: true, db: 'up' });
  });

  it('wrong types in profile fields respond 400 naming the field and change nothing', async () => {
    const { user, password } = await createUser();
    const browser = await signedInAgent(testApp(), user.email, password);
    const res = await browser.agent
      .patch('/api/me')
      .set(CSRF_HEADER, browser.csrf)
      .send({ birth_year: 'nineteen ninety', weight_kg: -3, unit: 'furlongs' });
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field).sort()).toEqual(['birth_year', 'unit', 'weight_kg']);
    expect((await db('users').where({ id: user.id }).first())!.unit).toBe('mi');
  });
});

describe('GET /api/health and the API description', () => {
  it('health says the database is up', async () => {
    expect((await request(testApp()).get('/api/health')).body).toEqual({ ok: true, db: 'up' });
  });

  it('GET /api/openapi.json is generated from the zod schemas', async () => {
    const res = await request(testApp()).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    const register = res.body.paths['/api/auth/register'].post;
    const schema = register.requestBody.content['application/json'].schema;
    expect(schema.required.sort()).toEqual(['email', 'name', 'password', 'role']);
    expect(schema.properties.role.enum).toEqual(['runner', 'coach']);
    expect(res.body.paths['/api/admin/users/{id}'].patch['x-access']).toBe('users:manage');
    const page = await request(testApp()).get('/api/docs');
    expect(page.status).toBe(200);
    expect(page.text).toContain('/api/auth/login');
  });
});
