// Every write use case refuses a role the policy table does not allow, before it writes anything.
// The use cases are called directly (no HTTP) on the real test database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { AppError } from '~/server/errors';
import { lessons, memberships, studios } from '~/db/schema';
import type { Actor } from '~/lib/policy';
import type { Role } from '~/lib/api/auth-schemas';
import { createClass, deleteClass, updateClassDetails } from '~/server/use-cases/class-details';
import { saveClassPlan, saveClassTimeline } from '~/server/use-cases/class-marks';
import { publishClass } from '~/server/use-cases/publish-class';
import { schedulePublish } from '~/server/use-cases/schedule-publish';
import { archiveClass, unpublishClass } from '~/server/use-cases/withdraw-class';
import { markReadyForReview, sendBackForChanges } from '~/server/use-cases/review-hand-off';
import { planSchema } from '~/lib/plan/plan-schema';
import { SMALL_PLAN } from '../helpers/published-class';
import { billingDeps } from '~/server/payments/billing-deps';
import { inviteToTeam, withdrawInvitation } from '~/server/use-cases/team';
import { createPromo, setPromoCodeActive, updateMembershipSettings } from '~/server/use-cases/studio-billing';
import { confirmCheckout } from '~/server/use-cases/confirm-checkout';
import { cancelMembership, resumeMembership, startMembership } from '~/server/use-cases/membership';

const deps = createAppDeps(process.env.DATABASE_URL!);
let studioId = '';
let userId = '';
let lesson: typeof lessons.$inferSelect;

beforeAll(async () => {
  const [studio] = await deps.db.select().from(studios).where(eq(studios.slug, deps.studioSlug));
  studioId = studio!.id;
  const [owner] = await deps.db.select().from(memberships).where(eq(memberships.role, 'owner'));
  userId = owner!.userId;
  // A fresh draft of our own, so other tests' classes are never touched.
  const [row] = await deps.db
    .insert(lessons)
    .values({ studioId, coachId: userId, slug: `permissions-${Date.now()}`, title: 'Permissions', advertisedMinutes: 20 })
    .returning();
  lesson = row!;
});
afterAll(async () => {
  await deps.db.delete(lessons).where(eq(lessons.id, lesson.id));
  await deps.pool.end();
});

// Billing use cases take the payment client too; built on first use (tests run against the payments fake).
const billing = () => ({ ...deps, stripe: billingDeps().stripe });
const as = (role: Role): Actor => ({ userId, studioId, roles: [role] });
const soon = () => new Date(Date.now() + 3600_000);

// Each write, and the roles the policy table refuses it to.
const writes: [string, Role[], (actor: Actor) => Promise<unknown>][] = [
  ['createClass', ['member'], (a) => createClass(a, deps, { title: 'Refused', advertisedMinutes: 20, description: '', equipment: [], impact: 'low', focus: [], difficulty: 'beginner', cautions: '' })],
  ['updateClassDetails', ['member'], (a) => updateClassDetails(a, deps, { lessonId: lesson.id, details: { version: lesson.version, title: 'Taken over' } })],
  ['deleteClass', ['editor', 'member'], (a) => deleteClass(a, deps, { lessonId: lesson.id })],
  ['saveClassPlan', ['member'], (a) => saveClassPlan(a, deps, { lessonId: lesson.id, version: lesson.version, plan: planSchema.parse(SMALL_PLAN) })],
  ['saveClassTimeline', ['member'], (a) => saveClassTimeline(a, deps, { lessonId: lesson.id, version: 0, timeline: { segments: [], cues: [] } })],
  ['publishClass', ['editor', 'member'], (a) => publishClass(a, deps, { lessonId: lesson.id, acknowledgeWarnings: true })],
  ['schedulePublish', ['coach', 'editor', 'member'], (a) => schedulePublish(a, deps, { lessonId: lesson.id, when: { at: soon() }, acknowledgeWarnings: true })],
  ['unpublishClass', ['editor', 'member'], (a) => unpublishClass(a, deps, { lessonId: lesson.id })],
  ['archiveClass', ['editor', 'member'], (a) => archiveClass(a, deps, { lessonId: lesson.id })],
  ['markReadyForReview', ['member'], (a) => markReadyForReview(a, deps, { lessonId: lesson.id, note: 'Refused' })],
  ['sendBackForChanges', ['editor', 'member'], (a) => sendBackForChanges(a, deps, { lessonId: lesson.id, note: 'Refused' })],
  ['inviteToTeam', ['coach', 'editor', 'member'], (a) => inviteToTeam(a, deps, { email: 'refused@members.example', role: 'coach' })],
  ['withdrawInvitation', ['coach', 'editor', 'member'], (a) => withdrawInvitation(a, deps, { id: '00000000-0000-4000-8000-000000000000' })],
  ['updateMembershipSettings', ['coach', 'editor', 'member'], (a) => updateMembershipSettings(a, billing(), { monthlyPriceMinor: 1, trialDays: 0, pastDueGraceDays: 0, version: null })],
  ['createPromo', ['coach', 'editor', 'member'], (a) => createPromo(a, billing(), { code: 'REFUSED', percentOff: 10, expiresAt: null })],
  ['setPromoCodeActive', ['coach', 'editor', 'member'], (a) => setPromoCodeActive(a, billing(), { id: '00000000-0000-4000-8000-000000000000', active: false })],
  ['confirmCheckout', ['owner', 'coach', 'editor'], (a) => confirmCheckout(a, billing())],
  ['startMembership', ['owner', 'coach', 'editor'], (a) => startMembership(a, billing(), { promoCode: undefined, payer: { email: 'refused@members.example', name: 'Refused' } })],
  ['cancelMembership', ['owner', 'coach', 'editor'], (a) => cancelMembership(a, billing())],
  ['resumeMembership', ['owner', 'coach', 'editor'], (a) => resumeMembership(a, billing())],
];

const cases = writes.flatMap(([name, refused, call]) => refused.map((role) => [name, role, call] as const));

describe('write use cases refuse roles the policy table does not allow', () => {
  it.each(cases)('%s as %s: forbidden, nothing written', async (_name, role, call) => {
    const before = await deps.db.select().from(lessons).where(eq(lessons.id, lesson.id));
    const err = await call(as(role)).then(() => null, (e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).code).toBe('forbidden');
    expect(await deps.db.select().from(lessons).where(eq(lessons.id, lesson.id))).toEqual(before);
  });

  it('an actor with no role at all is refused every write', async () => {
    for (const [, , call] of writes) {
      const err = await call({ userId, studioId, roles: [] }).then(() => null, (e: unknown) => e);
      expect((err as AppError).code).toBe('forbidden');
    }
  });
});
