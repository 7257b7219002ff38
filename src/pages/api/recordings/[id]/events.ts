import type { APIRoute } from 'astro';
import { recordingEventsOutput, recordingEventsQuery } from '~/lib/api/marking-schemas';
import { app } from '~/server/app';
import { answer, endpoint, parseWith } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { listRecordingEvents } from '~/server/services/recording-events';

/** The audio events heard in a recording, a page at a time (staff). */
export const GET: APIRoute = endpoint(async ({ locals, params, url }) => {
  const { studio } = requireCan(locals, 'class.view');
  const page = parseWith(recordingEventsQuery, Object.fromEntries(url.searchParams));
  return answer(recordingEventsOutput, await listRecordingEvents(app(), studio.studioId, params.id!, page));
});
