import { z } from 'zod';

/**
 * The `[id]` of every route (classes, recordings, media, promo codes, invitations, studio pages):
 * a UUID in its textual form. Anything else names nothing we store, so it answers 404 before a
 * query ever sees it (PostgreSQL refuses to cast it to uuid, which used to surface as a 500).
 * `guid` rather than `uuid`: the 8-4-4-4-12 hex form PostgreSQL accepts, whatever the version bits.
 */
export const routeIdSchema = z.guid({ error: 'That page could not be found.' }).describe('Identifier (UUID)');

export const isRouteId = (value: string) => routeIdSchema.safeParse(value).success;

/** The `{id}` path parameter of a route, named for the document. */
const idParams = (what: string) => z.object({ id: routeIdSchema.describe(`${what} id`) });
export const lessonIdParams = idParams('Class');
export const recordingIdParams = idParams('Recording');
export const promoCodeIdParams = idParams('Promo code');
export const invitationIdParams = idParams('Invitation');
export const exerciseIdParams = idParams('Exercise');
export const studioIdParams = idParams('Studio');
/** `{id}` of the class and `{frameId}` of one of its frame-as-cover requests. */
export const coverFrameParams = z.object({ id: routeIdSchema.describe('Class id'), frameId: routeIdSchema.describe('Frame-as-cover request id') });
