import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import type { MailCatcher } from '../../server/features/mail/mail-catcher.ts';
import type { Mailer } from '../../server/lib/mailer.ts';
import { createUser } from '../support/factories.ts';
import { startTestMail } from '../support/mail.ts';
import { testConfig } from '../support/test-app.ts';

let catcher: MailCatcher;
let mailer: Mailer;
beforeAll(async () => ({ catcher, mailer } = await startTestMail()));
afterAll(async () => catcher.close());

type App = ReturnType<typeof createApp>;
const appWithMail = (): App => createApp({ config: testConfig({ publicUrl: 'http://pacewright.test' }), mailer });

async function person(app: App, role: 'runner' | 'coach' | 'admin' = 'runner', email?: string) {
  const { user, password } = await createUser({ role, ...(email ? { email } : {}) });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, password, auth: { Authorization: `Bearer ${token}` } };
}

async function outbox(app: App) {
  return (await request(app).get('/api/dev/outbox')).body.messages as Array<{
    to: string;
    subject: string;
    text: string;
    html: string;
  }>;
}

const tokenFrom = (text: string) => /\/invite\/(inv_[A-Za-z0-9_-]+)/.exec(text)![1]!;

describe('squads and invitations', () => {
  it('a coach creates a squad and invites by e-mail; the e-mail carries <app URL>/invite/<token>; the runner accepts; the coach can read their runs', async () => {
    const app = appWithMail();
    const coach = await person(app, 'coach');
    const squad = await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor Line Runners' });
    expect(squad.status).toBe(201);
    const invite = await request(app)
      .post(`/api/squads/${squad.body.squad.id}/invitations`)
      .set(coach.auth)
      .send({ email: 'New.Runner@example.test' });
    expect(invite.status).toBe(201);
    expect(invite.body.invitation).toMatchObject({ email: 'new.runner@example.test', expires_at: expect.any(String) });

    const [mail] = await outbox(app);
    expect(mail!.to).toBe('new.runner@example.test');
    expect(mail!.subject).toMatch(/Harbor Line Runners/);
    expect(mail!.text).toMatch(/http:\/\/pacewright\.test\/invite\/inv_/);
    expect(mail!.html).toMatch(/Accept the invitation/);
    const token = tokenFrom(mail!.text);

    const preview = await request(app).get(`/api/invitations/${token}`);
    expect(preview.body).toMatchObject({ squad: { name: 'Harbor Line Runners' }, status: 'open' });

    const runner = await person(app, 'runner', 'new.runner@example.test');
    const accepted = await request(app).post(`/api/invitations/${token}/accept`).set(runner.auth);
    expect(accepted.status).toBe(200);
    expect(accepted.body.squad).toEqual(squad.body.squad);
    const coaches = (await request(app).get('/api/me/coaches').set(runner.auth)).body.coaches;
    expect(coaches).toEqual([
      { squad: squad.body.squad, coach: { id: coach.user.id, name: coach.user.name, email: coach.user.email } },
    ]);
    expect((await request(app).get(`/api/runs?runner_id=${runner.user.id}`).set(coach.auth)).status).toBe(200);

    // Reused: 410 with a sentence, nothing changes.
    const again = await request(app)
      .post(`/api/invitations/${token}/accept`)
      .set((await person(app)).auth);
    expect(again.status).toBe(410);
    expect(again.body.error).toMatch(/already been used/);
    expect(await db('squad_members').count({ n: '*' }).first()).toEqual({ n: '1' });
  });

  it('a forged, withdrawn or expired invitation is refused with a sentence', async () => {
    const app = appWithMail();
    const coach = await person(app, 'coach');
    const runner = await person(app);
    const squadId = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'S' })).body.squad.id;

    const forged = await request(app)
      .post(`/api/invitations/inv_${'A'.repeat(43)}/accept`)
      .set(runner.auth);
    expect(forged.status).toBe(400);
    expect(forged.body.error).toMatch(/not valid/);
    expect((await request(app).post('/api/invitations/nonsense/accept').set(runner.auth)).status).toBe(400);

    const inv = (await request(app).post(`/api/squads/${squadId}/invitations`).set(coach.auth).send({ email: 'a@example.test' }))
      .body.invitation;
    const token = tokenFrom((await outbox(app))[0]!.text);
    expect((await request(app).delete(`/api/squads/${squadId}/invitations/${inv.id}`).set(coach.auth)).status).toBe(204);
    const withdrawn = await request(app).post(`/api/invitations/${token}/accept`).set(runner.auth);
    expect(withdrawn.status).toBe(410);
    expect(withdrawn.body.error).toMatch(/withdrawn/);

    await request(app).post(`/api/squads/${squadId}/invitations`).set(coach.auth).send({ email: 'b@example.test' });
    const token2 = tokenFrom((await outbox(app))[0]!.text);
    await db('invitations')
      .where({ email: 'b@example.test' })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await request(app).post(`/api/invitations/${token2}/accept`).set(runner.auth);
    expect(expired.status).toBe(410);
    expect(expired.body.error).toMatch(/expired/);
    expect(await db('squad_members').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('a runner cannot create squads or invite (403); a coach cannot invite into another coach’s squad (404)', async () => {
    const app = appWithMail();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    const other = await person(app, 'coach');
    expect((await request(app).post('/api/squads').set(runner.auth).send({ name: 'Mine' })).status).toBe(403);
    const squadId = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'S' })).body.squad.id;
    expect(
      (await request(app).post(`/api/squads/${squadId}/invitations`).set(runner.auth).send({ email: 'x@example.test' })).status,
    ).toBe(403);
    expect(
      (await request(app).post(`/api/squads/${squadId}/invitations`).set(other.auth).send({ email: 'x@example.test' })).status,
    ).toBe(404);
    expect(
      (await request(app).post(`/api/squads/${squadId}/invitations`).set(coach.auth).send({ email: 'not an address' })).status,
    ).toBe(400);
    expect(await outbox(app)).toEqual([]);
  });

  it('a runner leaves; afterwards the coach can no longer read their runs (404)', async () => {
    const app = appWithMail();
    const coach = await person(app, 'coach');
    const runner = await person(app);
    const squadId = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'S' })).body.squad.id;
    await db('squad_members').insert({ squad_id: squadId, runner_id: runner.user.id });
    expect((await request(app).get(`/api/runs?runner_id=${runner.user.id}`).set(coach.auth)).status).toBe(200);
    expect((await request(app).delete(`/api/squads/${squadId}/members/${runner.user.id}`).set(runner.auth)).status).toBe(204);
    expect((await request(app).get(`/api/runs?runner_id=${runner.user.id}`).set(coach.auth)).status).toBe(404);
    expect((await request(app).get('/api/me/coaches').set(runner.auth)).body.coaches).toEqual([]);
  });

  it('GET /api/dev/outbox answers 404 in production', async () => {
    const prod = createApp({ config: { ...testConfig(), env: 'production' }, mailer });
    expect((await request(prod).get('/api/dev/outbox')).status).toBe(404);
  });
});
