import { eq } from 'drizzle-orm';
import { studios } from '~/db/schema';
import type { StudioClockInput } from '~/lib/api/studio-schemas';
import { notFound } from '../errors';
import type { AppDeps } from '../app';
import { assertCan, type Actor } from './actor';

/** Sets the zone and locale the studio's dates are read in (owner only). Scheduled publishes keep their instant. */
export async function updateStudioClock(actor: Actor, deps: AppDeps, input: StudioClockInput): Promise<StudioClockInput> {
  assertCan(actor, 'studio.settings');
  const [row] = await deps.db
    .update(studios)
    .set({ timeZone: input.timeZone, locale: input.locale })
    .where(eq(studios.id, actor.studioId))
    .returning({ timeZone: studios.timeZone, locale: studios.locale });
  if (!row) throw notFound('That studio');
  return row;
}
