import { and, eq, sql } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';
import { exercises, lessons, memberships, studios, users } from '../db/schema';
import { planSchema } from '../lib/plan/plan-schema';
import { expandPlan } from '../lib/plan/expand-plan';
import { putTimeline } from '../server/services/timelines';
import { demoTimeline, withDeliberateMistakes } from './demo/demo-timelines';
import { createAppDeps } from '../server/app';
import { hashPassword } from '../server/auth/passwords';
import { env } from '../server/env';
import * as demo from './demo/fernhill';

/**
 * Loads the demo scenario. Idempotent: it only adds what is missing and never changes or removes
 * what people created or edited, so a second `npm start` keeps everything.
 */
const deps = createAppDeps(env().DATABASE_URL);
const { db } = deps;

await db.insert(studios).values(demo.studio).onConflictDoNothing();
const studio = (await db.query.studios.findFirst({ where: eq(studios.slug, demo.studio.slug) }))!;

const passwordHash = await hashPassword(demo.DEMO_PASSWORD);
const userIds = new Map<string, string>();
for (const p of demo.people) {
  let user = await db.query.users.findFirst({ where: sql`lower(${users.email}) = ${p.email}` });
  if (!user) {
    [user] = await db
      .insert(users)
      .values({ id: generateIdFromEntropySize(10), email: p.email, name: p.name, passwordHash, emailVerifiedAt: new Date() })
      .returning();
  }
  userIds.set(p.email, user!.id);
  for (const role of p.roles) {
    await db.insert(memberships).values({ userId: user!.id, studioId: studio.id, role }).onConflictDoNothing();
  }
}

for (const e of demo.exercises) {
  await db
    .insert(exercises)
    .values({ ...e, equipment: [...e.equipment], studioId: studio.id })
    .onConflictDoNothing();
}

let added = 0;
for (const l of demo.lessons) {
  const exists = await db.query.lessons.findFirst({ where: and(eq(lessons.studioId, studio.id), eq(lessons.slug, l.slug)) });
  if (exists) continue;
  const { coach, ...fields } = l;
  const plan = planSchema.parse(l.plan);
  const schedule = expandPlan(plan);
  const timeline = l.state === 'draft' ? withDeliberateMistakes(demoTimeline(schedule)) : demoTimeline(schedule);
  const mediaSeconds = Math.max(...timeline.segments.map((s) => s.endSeconds));
  const [row] = await db
    .insert(lessons)
    .values({ ...fields, plan, mediaSeconds, studioId: studio.id, coachId: userIds.get(coach)! })
    .returning({ id: lessons.id });
  await putTimeline(deps, studio.id, row!.id, 0, timeline);
  added++;
}
console.log(`demo data ready (${demo.studio.name}; ${added} classes added)`);
await deps.pool.end();
