import { and, count, eq } from 'drizzle-orm';
import { lessons, memberships, studios, users } from '~/db/schema';
import type { AppDeps } from '../app';

/** What the owner sees first: classes by state and the studio's people by role. */
export async function studioOverview(deps: AppDeps, studioId: string) {
  const byState = await deps.db
    .select({ state: lessons.state, n: count() })
    .from(lessons)
    .where(eq(lessons.studioId, studioId))
    .groupBy(lessons.state);
  const team = await deps.db
    .select({ id: users.id, name: users.name, email: users.email, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId)))
    .orderBy(users.name);
  const staff = new Map<string, { name: string; email: string; roles: string[] }>();
  let members = 0;
  for (const p of team) {
    if (p.role === 'member') {
      members++;
      continue;
    }
    const entry = staff.get(p.id) ?? { name: p.name, email: p.email, roles: [] };
    entry.roles.push(p.role);
    staff.set(p.id, entry);
  }
  const classes = { draft: 0, published: 0, archived: 0 };
  for (const s of byState) classes[s.state] = s.n;
  return { classes, staff: [...staff.values()], members };
}

/** The studio this deployment serves (its name and id for the public front page), or null before set-up. */
export async function servedStudio(deps: AppDeps): Promise<{ id: string; name: string; slug: string } | null> {
  const [row] = await deps.db.select({ id: studios.id, name: studios.name, slug: studios.slug }).from(studios).where(eq(studios.slug, deps.studioSlug));
  return row ?? null;
}
