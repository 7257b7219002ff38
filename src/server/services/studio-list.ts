import type { StudioOutput } from '~/lib/api/studio-schemas';
import type { AppDeps } from '../app';
import { studioAccess } from './accounts';
import { inArray } from 'drizzle-orm';
import { studios } from '~/db/schema';

/** The studios a person belongs to, as the API shows them. */
export async function listMyStudios(deps: AppDeps, userId: string): Promise<StudioOutput[]> {
  const access = await studioAccess(deps, userId);
  if (!access.length) return [];
  const colours = await deps.db
    .select({ id: studios.id, accentColour: studios.accentColour })
    .from(studios)
    .where(inArray(studios.id, access.map((a) => a.studioId)));
  const colourOf = new Map(colours.map((c) => [c.id, c.accentColour]));
  return access.map((a) => ({ id: a.studioId, slug: a.studioSlug, name: a.studioName, timeZone: a.timeZone, locale: a.locale, accentColour: colourOf.get(a.studioId) ?? '#B93A17', roles: a.roles }));
}

