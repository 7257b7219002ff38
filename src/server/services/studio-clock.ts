import { eq } from 'drizzle-orm';
import { studios } from '~/db/schema';
import { clockOf, type StudioClock } from '~/lib/time/date-format';
import type { AppDeps } from '../app';

/** The zone and locale a studio's dates are read in (for messages built away from a page). */
export async function studioClock(deps: AppDeps, studioId: string): Promise<StudioClock> {
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { timeZone: true, locale: true } });
  return clockOf(row);
}
