import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
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

const appWithMail = () => createApp({ config: testConfig({ publicUrl: 'http://pacewright.test' }), mailer });
const outbox = async (app: ReturnType<typeof appWithMail>) =>
  (await request(app).get('/api/dev/outbox')).body.messages as Array<{ to: string; subject: string; text: string }>;
const resetTokenFrom = (text: string) => /\/reset-password\/(rst_[A-Za-z0-9_-]+)/.exec(text)![1]!;

describe('password reset', () => {
  it('e-mails a link; the link sets a new password once; the old password and script tokens stop working', async () => {
    const app = appWithMail();
    const { user, password } = await createUser({ email: 'forgetful@example.test' });
    const oldToken = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token;
    const asked = await request(app).post('/api/auth/password-reset').send({ email: 'Forgetful@example.test' });
    expect(asked.status).toBe(202);
    await afterAnswerSettled();
    const [mail] = await outbox(app);
    expect(mail!.to).toBe('forgetful@example.test');
    const token = resetTokenFrom(mail!.text);

    expect((await request(app).post(`/api/auth/password-reset/${token}`).send({ password: 'a brand new secret' })).status).toBe(
      204,
    );
    expect((await request(app).post('/api/auth/login').send({ email: user.email, password })).status).toBe(401);
    expect((await request(app).post('/api/auth/login').send({ email: user.email, password: 'a brand new secret' })).status).toBe(
      200,
    );
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${oldToken}`)).status).toBe(401);

    const reused = await request(app).post(`/api/auth/password-reset/${token}`).send({ password: 'yet another secret' });
    expect(reused.status).toBe(410);
    expect(reused.body.error).toMatch(/already been used/);
  });

  it('answers the same for an unknown address and sends nothing', async () => {
    const app = appWithMail();
    const res = await request(app).post('/api/auth/password-reset').send({ email: 'nobody@example.test' });
    expect(res.status).toBe(202);
    await afterAnswerSettled();
    expect(await outbox(app)).toEqual([]);
  });

  it('refuses a forged or expired link with a sentence and changes nothing', async () => {
    const app = appWithMail();
    const { user, password } = await createUser();
    const forged = await request(app)
      .post(`/api/auth/password-reset/rst_${'B'.repeat(43)}`)
      .send({ password: 'a brand new secret' });
    expect(forged.status).toBe(400);
    expect(forged.body.error).toMatch(/not valid/);
    await request(app).post('/api/auth/password-reset').send({ email: user.email });
    await afterAnswerSettled();
    const token = resetTokenFrom((await outbox(app))[0]!.text);
    await db('password_resets').update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await request(app).post(`/api/auth/password-reset/${token}`).send({ password: 'a brand new secret' });
    expect(expired.status).toBe(410);
    expect(expired.body.error).toMatch(/expired/);
    expect((await request(app).post('/api/auth/login').send({ email: user.email, password })).status).toBe(200);
  });
});
