import { eq } from 'drizzle-orm';
import { studios } from '~/db/schema';
import type { S3Client } from '@aws-sdk/client-s3';
import type { StudioClockInput, StudioIdentityInput } from '~/lib/api/studio-schemas';
import { notFound } from '../errors';
import type { AppDeps } from '../app';
import { assertCan, type Actor } from './actor';
import { removeStudioLogo, storeStudioLogo, updateStudioIdentity, type StudioIdentity } from '../services/studio-identity';

type Storage = { s3: S3Client; bucket: string };

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

/** Renames the studio, moves its address (old links redirect) and recolours it (owner only). */
export async function changeStudioIdentity(actor: Actor, deps: AppDeps, input: StudioIdentityInput): Promise<StudioIdentity> {
  assertCan(actor, 'studio.settings');
  return updateStudioIdentity(deps, actor.studioId, input);
}

/** Uploads the studio's logo (owner only): checked by its bytes, scaled, stored as PNG. */
export async function uploadStudioLogo(actor: Actor, deps: AppDeps, storage: Storage, bytes: Uint8Array): Promise<StudioIdentity> {
  assertCan(actor, 'studio.settings');
  return storeStudioLogo(deps, storage, actor.studioId, bytes);
}

/** Takes the studio's logo away (owner only). */
export async function deleteStudioLogo(actor: Actor, deps: AppDeps, storage: Storage): Promise<StudioIdentity> {
  assertCan(actor, 'studio.settings');
  return removeStudioLogo(deps, storage, actor.studioId);
}
