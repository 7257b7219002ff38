// Helpers for the e-mail tests: fresh accounts, form posts as a browser sends them, and the
// links inside a received message. Everything goes through the running app and the SMTP fake.
import { randomUUID } from 'node:crypto';
import { expect } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient, BASE } from './api-client';
import { waitForMessage, type StoredMail } from './mail-box';
import { studios } from '~/db/schema';
import type { AppDeps } from '~/server/app';

export const PASSWORD = 'a long enough password';

/** A fresh address per test, so messages from earlier runs never match. */
export const freshEmail = (who: string) => `${who}-${randomUUID().slice(0, 8)}@members.example`;

/** Posts a form the way a browser does (urlencoded, with the Origin header Astro checks). */
export function postForm(client: ApiClient, path: string, fields: Record<string, string>): Promise<Response> {
  return client.request('POST', path, new URLSearchParams(fields).toString(), {
    'content-type': 'application/x-www-form-urlencoded',
  });
}

/** The studio's name as stored, so checks never hard-code demo data. */
export async function studioName(deps: AppDeps): Promise<string> {
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.slug, deps.studioSlug) });
  if (!row) throw new Error(`studio ${deps.studioSlug} missing`);
  return row.name;
}

/** Signs a new member up through the API; the sign-up sends the verification message. */
export async function signUpMember(who: string, since = new Date(Date.now() - 1000)) {
  const client = new ApiClient();
  const email = freshEmail(who);
  const name = `${who[0]!.toUpperCase()}${who.slice(1)} Tester`;
  const userId = await client.signUpAndIn({ name, email, password: PASSWORD });
  return { client, email, name, userId, since };
}

/** Signs up and follows the e-mailed confirmation link, like a person would. */
export async function verifiedMember(who: string) {
  const m = await signUpMember(who);
  const mail = await waitForMessage(m.email, { since: m.since, match: (e) => /confirm/i.test(e.subject ?? '') });
  const res = await m.client.get(pathOf(onlyAppLink(mail)));
  if (res.status !== 200) throw new Error(`verification link answered ${res.status}`);
  return m;
}

/** Absolute links into the app found in the plain-text part, in order. */
export function textLinks(mail: StoredMail): string[] {
  const base = BASE();
  return [...(mail.parsed.text ?? '').matchAll(/https?:\/\/[^\s<>"]+/g)].map((m) => m[0]).filter((u) => u.startsWith(base));
}

/** Absolute links into the app found as href in the HTML part. */
export function htmlLinks(mail: StoredMail): string[] {
  const html = typeof mail.parsed.html === 'string' ? mail.parsed.html : '';
  return [...html.matchAll(/href="([^"]+)"/g)].map((m) => m[1]!.replace(/&amp;/g, '&')).filter((u) => u.startsWith(BASE()));
}

/**
 * The one distinct app link a message is about; both parts must carry it (the HTML twice: the
 * button and the copyable address).
 */
export function onlyAppLink(mail: StoredMail, path?: RegExp): string {
  const fromText = [...new Set(textLinks(mail))].filter((u) => !path || path.test(new URL(u).pathname));
  expect(fromText, 'one link of that kind in the text part').toHaveLength(1);
  expect(htmlLinks(mail)).toContain(fromText[0]);
  return fromText[0]!;
}

/** The path and query of an absolute link, to request through an ApiClient. */
export const pathOf = (url: string) => {
  const u = new URL(url);
  return u.pathname + u.search;
};

/** The checks every message shares: both parts, the addressee, the studio's name as sender and in the body. */
export function expectWellFormed(mail: StoredMail, to: string, studio: string): void {
  const toHeader = Array.isArray(mail.parsed.to) ? mail.parsed.to[0] : mail.parsed.to;
  expect(toHeader?.value.map((a) => a.address)).toEqual([to]);
  expect(mail.parsed.from?.value[0]?.name).toBe(studio);
  expect(mail.parsed.subject).toBeTruthy();
  expect(mail.parsed.text).toContain(studio);
  expect(typeof mail.parsed.html).toBe('string');
  expect(mail.parsed.html as string).toContain(studio.replace(/&/g, '&amp;'));
  expect(mail.parsed.html as string).toMatch(/^<!doctype html>/i);
}
