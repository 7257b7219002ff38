/**
 * A studio of its own for the API fuzz test: one person per role, a class with a processed
 * recording, a draft, a promo code and an invitation. Whatever the fuzzer manages to change stays
 * in this studio, so the demo studio the other tests read is left as it was. Names are invented.
 */
import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import type { AppDeps } from '~/server/app';
import { hashPassword } from '~/server/auth/passwords';
import { lessons, memberships, studios, users } from '~/db/schema';
import { ApiClient } from './api-client';
import { createSmallClass } from './published-class';

export const FUZZ_ROLES = ['owner', 'coach', 'editor', 'member'] as const;
export type FuzzRole = (typeof FUZZ_ROLES)[number] | 'anonymous';

export interface FuzzStudio {
  studioId: string;
  emails: Record<(typeof FUZZ_ROLES)[number], string>;
  password: string;
  /** Ids that exist, by the kind of thing a route parameter names. */
  ids: { lesson: string[]; recording: string[]; promo: string[]; invitation: string[]; otherStudio: string[] };
}

async function expectStatus(res: Response, status: number, what: string): Promise<Record<string, unknown>> {
  const text = await res.text();
  if (res.status !== status) throw new Error(`${what}: ${res.status} ${text}`);
  return text ? (JSON.parse(text) as Record<string, unknown>) : {};
}

/** Creates the studio and its people in the database (there is no API for a new studio). */
export async function createFuzzStudio(deps: AppDeps): Promise<FuzzStudio> {
  const tag = Date.now().toString(36);
  const password = `fuzz-studio-${tag}-password`;
  const passwordHash = await hashPassword(password);
  const [studio] = await deps.db.insert(studios).values({ slug: `fuzz-${tag}`, name: 'Fuzz Test Studio' }).returning();
  const emails = Object.fromEntries(FUZZ_ROLES.map((r) => [r, `fuzz-${r}-${tag}@test.example`])) as FuzzStudio['emails'];
  for (const role of FUZZ_ROLES) {
    const id = randomUUID();
    await deps.db.insert(users).values({ id, email: emails[role], name: `Fuzz ${role}`, passwordHash, emailVerifiedAt: new Date() });
    await deps.db.insert(memberships).values({ userId: id, studioId: studio!.id, role });
  }
  const [demoLesson] = await deps.db.select({ id: lessons.id }).from(lessons).where(eq(lessons.slug, 'hill-sprints-prep'));
  return { studioId: studio!.id, emails, password, ids: { lesson: [], recording: [], promo: [], invitation: [], otherStudio: demoLesson ? [demoLesson.id] : [] } };
}

export async function signInAs(studio: FuzzStudio, role: (typeof FUZZ_ROLES)[number], client = new ApiClient()): Promise<ApiClient> {
  await expectStatus(await client.signIn(studio.emails[role], studio.password), 200, `sign-in as ${role}`);
  return client;
}

/** Things for the route ids to point at: a published class with a real recording, a draft, a promo code, an invitation. */
export async function seedFuzzStudio(studio: FuzzStudio, owner: ApiClient, coach: ApiClient): Promise<void> {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-fuzz-'));
  try {
    const published = await createSmallClass(coach, dir, `Fuzz class ${Date.now()}`);
    await expectStatus(await coach.post(`/api/lessons/${published.lessonId}/publish`, { acknowledgeWarnings: true }), 201, 'publish');
    const draft = await expectStatus(await coach.post('/api/lessons', { title: 'Fuzz draft', advertisedMinutes: 20 }), 201, 'draft');
    const announced = await expectStatus(
      await coach.post(`/api/lessons/${String(draft.id)}/recordings`, { fileName: 'draft.mp4', sizeBytes: 1000, contentType: 'video/mp4' }),
      201,
      'announce a recording',
    );
    const settings = await expectStatus(await owner.get('/api/billing/settings'), 200, 'billing settings');
    await expectStatus(await owner.put('/api/billing/settings', { monthlyPriceMinor: 1500, trialDays: 7, pastDueGraceDays: 3, version: settings.version ?? null }), 200, 'billing settings');
    const promo = await expectStatus(await owner.post('/api/billing/promo-codes', { code: `FUZZ${Date.now().toString(36).toUpperCase()}`, percentOff: 10 }), 201, 'promo');
    const invitation = await expectStatus(await owner.post('/api/invitations', { email: `invited-${Date.now()}@test.example`, role: 'editor' }), 201, 'invitation');
    studio.ids.lesson.push(published.lessonId, String(draft.id));
    studio.ids.recording.push(published.recordingId, String(announced.id));
    studio.ids.promo.push(String(promo.id));
    studio.ids.invitation.push(String(invitation.id));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
