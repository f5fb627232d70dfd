import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitationPreviewSchema, invitationSchema } from '../../shared/api/studios.js';
import { DEMO_STUDIO_ID, PUBLIC_URL, linkIn, sessionCookie, startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
let instructor: string;
beforeAll(async () => {
  t = await startTestApp();
  instructor = await t.cookieFor('instructor@example.org');
});
afterAll(async () => {
  await t.close();
});

async function invite(email: string, role: 'instructor' | 'critic' | 'participant' = 'participant'): Promise<string> {
  const before = (await t.outbox()).length;
  const res = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor).send({ email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  invitationSchema.parse(res.body);
  const mail = (await t.outbox()).slice(before);
  expect(mail).toHaveLength(1);
  return linkIn(mail[0].text, `${PUBLIC_URL}/invitations/`).split('/').pop()!;
}

describe('invitations', () => {
  it('lets a newcomer create an account from the e-mailed link and land in the studio with the invited role', async () => {
    const token = await invite('Ada.Newcomer@example.org', 'critic');
    const [message] = (await t.outbox()).slice(-1);
    expect(message.to).toContain('ada.newcomer@example.org');
    expect(message.subject).toBe('You are invited to Quillmarsh Lamp Studio on Planewright');
    expect(message.text).toMatch(/Tomasz Elberg has invited you to join the studio "Quillmarsh Lamp Studio" on Planewright as a critic/);

    const preview = await request(t.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(invitationPreviewSchema.parse(preview.body)).toMatchObject({ studioName: 'Quillmarsh Lamp Studio', role: 'critic', email: 'ada.newcomer@example.org', invitedBy: 'Tomasz Elberg', accountExists: false });

    const accept = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Ada Newcomer', password: 'ada-long-password' });
    expect(accept.status).toBe(201);
    expect(accept.body).toMatchObject({ email: 'ada.newcomer@example.org', name: 'Ada Newcomer', memberships: [{ studioId: DEMO_STUDIO_ID, role: 'critic' }] });
    const me = await request(t.app).get('/api/auth/me').set('Cookie', sessionCookie(accept));
    expect(me.body.email).toBe('ada.newcomer@example.org');

    const second = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Someone Else', password: 'another-password' });
    expect(second.status).toBe(410);
    expect(second.body.error.code).toBe('invitation_used');
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(410);

    const list = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor);
    expect(list.body.find((i: { email: string }) => i.email === 'ada.newcomer@example.org').state).toBe('accepted');
  });

  it('asks a newcomer for name and password, naming the fields', async () => {
    const token = await invite('bo.fields@example.org');
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).send({});
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields)).toEqual(['body.name', 'body.password']);
  });

  it('lets an existing account accept while signed in as the invited address', async () => {
    const other = await startTestAppStudio();
    const token = await invite('lonely@example.org');
    const preview = await request(t.app).get(`/api/invitations/${token}`);
    expect(preview.body.accountExists).toBe(true);
    const anonymous = await request(t.app).post(`/api/invitations/${token}/accept`).send({});
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.message).toMatch(/Sign in as lonely@example.org/);
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).set('Cookie', other).send({});
    expect(res.status).toBe(201);
    expect(res.body.memberships).toEqual([expect.objectContaining({ studioId: DEMO_STUDIO_ID, role: 'participant' })]);
  });

  it('refuses a different signed-in person with 403 naming the invited address', async () => {
    const token = await invite('someone.else@example.org');
    const critic = await t.cookieFor('critic@example.org');
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).set('Cookie', critic).send({});
    expect(res.status).toBe(403);
    expect(res.body.error.message).toContain('This invitation is for someone.else@example.org');
    // Still usable by the right person afterwards.
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(200);
  });

  it('expires after seven days', async () => {
    const token = await invite('late@example.org');
    t.clock.advance(7 * 24 * 60 * 60 * 1000 + 1);
    try {
      const preview = await request(t.app).get(`/api/invitations/${token}`);
      expect(preview.status).toBe(410);
      expect(preview.body.error.code).toBe('invitation_expired');
      const accept = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Late', password: 'late-long-password' });
      expect(accept.status).toBe(410);
    } finally {
      t.clock.advance(-(7 * 24 * 60 * 60 * 1000 + 1));
    }
  });

  it('answers an unknown token with 404', async () => {
    const res = await request(t.app).get(`/api/invitations/${'z'.repeat(43)}`);
    expect(res.status).toBe(404);
  });

  it('refuses to invite an existing member with 409', async () => {
    const res = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor).send({ email: 'participant@example.org', role: 'critic' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already_member');
  });

  it('replaces a pending invitation when the address is invited again', async () => {
    const first = await invite('twice@example.org', 'participant');
    const second = await invite('twice@example.org', 'critic');
    expect((await request(t.app).get(`/api/invitations/${first}`)).status).toBe(404);
    expect((await request(t.app).get(`/api/invitations/${second}`)).body.role).toBe('critic');
    const list = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor);
    expect(list.body.filter((i: { email: string }) => i.email === 'twice@example.org')).toHaveLength(1);
  });

  it('revokes an invitation so its link answers 410', async () => {
    const token = await invite('revoked@example.org');
    const list = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor);
    const id = list.body.find((i: { email: string }) => i.email === 'revoked@example.org').id;
    expect((await request(t.app).delete(`/api/studios/${DEMO_STUDIO_ID}/invitations/${id}`).set('Cookie', instructor)).status).toBe(204);
    const res = await request(t.app).get(`/api/invitations/${token}`);
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_revoked');
    expect((await request(t.app).delete(`/api/studios/${DEMO_STUDIO_ID}/invitations/99999`).set('Cookie', instructor)).status).toBe(404);
  });

  it('stores only a hash of the token', async () => {
    const token = await invite('hashed@example.org');
    const rows: { token_hash: string }[] = await t.ds.query('SELECT token_hash FROM invitations');
    expect(rows.some((r) => r.token_hash === token)).toBe(false);
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.token_hash))).toBe(true);
  });

  it('names the bad fields of an invitation', async () => {
    const res = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/invitations`).set('Cookie', instructor).send({ email: 'nope', role: 'boss' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['body.email', 'body.role']);
  });
});

/** An existing account with no studio, signed in. */
async function startTestAppStudio(): Promise<string> {
  await t.addUser('lonely@example.org', 'Lonely Existing');
  return t.cookieFor('lonely@example.org');
}
