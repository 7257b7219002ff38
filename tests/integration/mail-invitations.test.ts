// Staff invitations: the owner invites by e-mail, the message arrives at the SMTP fake, and its
// link grants the role on accept (to a signed-in person with that address, or to a new account
// made from the invitation) and not after expiry or withdrawal.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, freshEmail, onlyAppLink, PASSWORD, pathOf, postForm, signUpMember, studioName } from '../helpers/mail-flow';
import { createAppDeps } from '~/server/app';
import { invitations, users } from '~/db/schema';
import { hashToken } from '~/server/mail/tokens';

const deps = createAppDeps(process.env.DATABASE_URL!);
let studio: string;
let owner: ApiClient;
let ownerName: string;
beforeAll(async () => {
  studio = await studioName(deps);
  owner = await signedIn(DEMO.owner);
  ownerName = (await (await owner.get('/api/me')).json()).user.name;
});
afterAll(() => deps.pool.end());

const rolesOf = async (c: ApiClient) => ((await (await c.get('/api/me')).json()).studio?.roles ?? []) as string[];

async function invite(email: string, role: 'coach' | 'editor') {
  const since = new Date();
  const res = await owner.post('/api/invitations', { email, role });
  expect(res.status).toBe(201);
  const body = await res.json();
  const mail = await waitForMessage(email, { since, match: (e) => /invited you/.test(e.subject ?? '') });
  const link = onlyAppLink(mail, /^\/invitations\//);
  return { id: body.id as string, body, mail, link, token: decodeURIComponent(new URL(link).pathname.split('/').pop()!) };
}

describe('staff invitations', () => {
  it('e-mails the invitation, and a new person creates an account from it and gets the role', async () => {
    const email = freshEmail('iris');
    const { body, mail, link, token } = await invite(email, 'editor');
    expect(body).toMatchObject({ email, role: 'editor' });
    // Invitations last 7 days.
    const days = (Date.parse(body.expiresAt) - Date.parse(body.createdAt)) / 86_400_000;
    expect(days).toBeCloseTo(7, 2);

    expectWellFormed(mail, email, studio);
    expect(mail.parsed.subject).toBe(`${ownerName} invited you to join ${studio} as an editor`);
    expect(mail.parsed.text).toContain('mark segments and cues');
    const stored = await deps.db.query.invitations.findFirst({ where: eq(invitations.id, body.id) });
    expect(stored!.tokenHash).toBe(hashToken(token));

    const visitor = new ApiClient();
    const page = await visitor.get(pathOf(link));
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain(`Join ${studio}`);
    expect(html).toContain('?_action=acceptInvitationAsNewAccount');

    const created = await postForm(visitor, `${pathOf(link)}?_action=acceptInvitationAsNewAccount`, { name: 'Iris Newcomer', password: PASSWORD });
    expect(created.status).toBe(303);
    expect(created.headers.get('location')).toBe('/studio/classes');
    expect(await rolesOf(visitor)).toEqual(['editor']);
    // Opening the e-mailed link proved the address.
    const user = await deps.db.query.users.findFirst({ where: eq(users.email, email) });
    expect(user!.emailVerifiedAt).toBeInstanceOf(Date);

    const reused = await new ApiClient().get(pathOf(link));
    expect(reused.status).toBe(410);
    expect(await reused.text()).toContain('already been accepted');
  });

  it('lets a signed-in person with the invited address accept, and nobody else', async () => {
    const m = await signUpMember('cato');
    const { link } = await invite(m.email, 'coach');

    const stranger = (await signUpMember('sly')).client;
    const shown = await stranger.get(pathOf(link));
    expect(await shown.text()).toContain('this invitation is for');
    const refused = await postForm(stranger, `${pathOf(link)}?_action=acceptInvitation`, {});
    expect(refused.status).toBe(403);
    expect(await refused.text()).toContain(`This invitation was sent to ${m.email}`);
    expect(await rolesOf(stranger)).toEqual(['member']);

    const page = await m.client.get(pathOf(link));
    expect(await page.text()).toContain('Join as a coach');
    const accepted = await postForm(m.client, `${pathOf(link)}?_action=acceptInvitation`, {});
    expect(accepted.status).toBe(303);
    expect((await rolesOf(m.client)).sort()).toEqual(['coach', 'member']);
  });

  it('lets someone with an account sign in on the invitation page to accept', async () => {
    const m = await signUpMember('otto');
    const { link } = await invite(m.email, 'editor');
    const browser = new ApiClient();
    const page = await browser.get(pathOf(link));
    expect(await page.text()).toContain('?_action=signInToAcceptInvitation');
    const wrong = await postForm(browser, `${pathOf(link)}?_action=signInToAcceptInvitation`, { password: 'not the password' });
    expect(wrong.status).toBe(400);
    const ok = await postForm(browser, `${pathOf(link)}?_action=signInToAcceptInvitation`, { password: PASSWORD });
    expect(ok.status).toBe(303);
    expect((await rolesOf(browser)).sort()).toEqual(['editor', 'member']);
  });

  it('grants nothing after the invitation expires', async () => {
    const email = freshEmail('late');
    const { id, link } = await invite(email, 'coach');
    await deps.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, id));
    const visitor = new ApiClient();
    const page = await visitor.get(pathOf(link));
    expect(page.status).toBe(410);
    expect(await page.text()).toContain('has expired');
    const tried = await postForm(visitor, `${pathOf(link)}?_action=acceptInvitationAsNewAccount`, { name: 'Late Comer', password: PASSWORD });
    expect(tried.status).toBe(410);
    expect(await deps.db.query.users.findFirst({ where: eq(users.email, email) })).toBeUndefined();

    // Expired invitations stay listed, marked, so the owner can send a new one.
    const team = await (await owner.get('/studio/team')).text();
    expect(team).toContain(email);
    expect(team).toMatch(/Expired \d/);
  });

  it('withdraws a pending invitation: its link stops working', async () => {
    const email = freshEmail('wanda');
    const { id, link } = await invite(email, 'editor');
    const team = await (await owner.get('/studio/team')).text();
    expect(team).toContain(`data-invitation="${email}"`);
    expect((await owner.del(`/api/invitations/${id}`)).status).toBe(204);
    expect((await new ApiClient().get(pathOf(link))).status).toBe(404);
    expect((await owner.del(`/api/invitations/${id}`)).status).toBe(404);
    expect((await owner.del('/api/invitations/not-a-uuid')).status).toBe(404);
  });

  it('replaces a pending invitation to the same address with a new one', async () => {
    const email = freshEmail('twice');
    const first = await invite(email, 'editor');
    const second = await invite(email, 'coach');
    expect((await new ApiClient().get(pathOf(first.link))).status).toBe(404);
    expect((await new ApiClient().get(pathOf(second.link))).status).toBe(200);
    const listed = (await (await owner.get('/api/invitations')).json()).invitations.filter((i: { email: string }) => i.email === email);
    expect(listed).toEqual([expect.objectContaining({ id: second.id, role: 'coach' })]);
  });

  it.each([
    ['coach', DEMO.coach],
    ['editor', DEMO.editor],
    ['member', DEMO.member],
  ])('refuses invitations from a %s (owner only)', async (_role, who) => {
    const c = await signedIn(who);
    expect((await c.post('/api/invitations', { email: freshEmail('x'), role: 'coach' })).status).toBe(403);
    expect((await c.get('/studio/team')).status).toBe(403);
  });

  it('checks the input and refuses inviting someone who already has the role', async () => {
    const bad = await owner.post('/api/invitations', { email: 'nope', role: 'owner' });
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(['email', 'role']);
    const dup = await owner.post('/api/invitations', { email: DEMO.coach, role: 'coach' });
    expect(dup.status).toBe(409);
    expect((await dup.json()).error.fields.email).toMatch(/already a coach/);
  });

  it('shows the team page with the invite form to the owner, and sends from its form', async () => {
    const page = await owner.get('/studio/team');
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Invite someone');
    expect(html).toContain('href="/studio/team"');
    const email = freshEmail('form');
    const since = new Date();
    // The form's own target: the team page's Astro Action (src/actions/studio-actions.ts).
    const sent = await postForm(owner, '/studio/team?_action=inviteToTeam', { email, role: 'coach' });
    expect(sent.status).toBe(303);
    await waitForMessage(email, { since });
  });
});
