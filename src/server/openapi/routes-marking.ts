import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { proposalOutput, proposeInput, recordingEventsOutput, recordingEventsQuery } from '~/lib/api/marking-schemas';
import { lessonIdParams as lessonParams, recordingIdParams as recordingParams } from '~/lib/api/route-params';
import { errors, json } from './responses';


/** Routes of "Mark it for me": the recording's audio events and the proposed timeline. */
export const markingRoutes: RouteConfig[] = [
  {
    method: 'get', path: '/api/recordings/{id}/events',
    summary: 'Audio events heard in the recording (timer tones, whistles, speech, level changes), ordered by time, a page at a time (staff)',
    request: { params: recordingParams, query: recordingEventsQuery },
    responses: { 200: json(recordingEventsOutput, 'One page of events'), ...errors(400, 401, 403, 404) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/timeline/propose',
    summary: 'Mark it for me: a whole proposed timeline from the plan and the current recording’s sounds, with a confidence per boundary (staff). Nothing is saved: save an accepted proposal with PUT /api/lessons/{id}/timeline',
    request: { params: lessonParams, body: json(proposeInput, 'Empty object') },
    responses: {
      200: json(proposalOutput, 'The proposal'),
      ...errors(400, 401, 403, 404, 409, 422),
    },
  },
];
