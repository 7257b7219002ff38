import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { lessonIdParams as params } from '~/lib/api/route-params';
import { captionFileText, captionsImportQuery, captionsOutput, captionsPutSchema, captionsSavedOutput, playerPreferencesPut } from '~/lib/captions/caption-schema';
import { errors, json } from './responses';

/** Routes of captions: the class's draft captions (staff) and the member's captions choice. */
export const captionRoutes: RouteConfig[] = [
  {
    method: 'get', path: '/api/lessons/{id}/captions', summary: 'The draft captions of a class (version 0 and no cues before the first save), with the current recording’s length',
    request: { params },
    responses: { 200: json(captionsOutput, 'Captions'), ...errors(401, 403, 404) },
  },
  {
    method: 'put', path: '/api/lessons/{id}/captions',
    summary: 'Replace the captions (an empty list removes them); times must lie within the current recording; a stale version answers 409',
    request: { params, body: json(captionsPutSchema, 'All captions and the version they were read at') },
    responses: { 200: json(captionsSavedOutput, 'Saved'), ...errors(400, 401, 403, 404, 409, 422) },
  },
  {
    method: 'post', path: '/api/lessons/{id}/captions/import',
    summary: 'Replace the captions with a WebVTT or SubRip (.srt) file; a bad file stores nothing',
    request: {
      params,
      query: captionsImportQuery,
      body: { description: 'A WebVTT or SubRip file', content: { 'text/vtt': { schema: captionFileText }, 'application/x-subrip': { schema: captionFileText } } },
    },
    responses: { 200: json(captionsSavedOutput, 'Imported'), ...errors(400, 401, 403, 404, 409, 413, 422) },
  },
  {
    method: 'get', path: '/api/me/player-preferences', summary: 'The member’s remembered player choices (captions off until turned on)',
    responses: { 200: json(playerPreferencesPut, 'Remembered choices'), ...errors(401) },
  },
  {
    method: 'put', path: '/api/me/player-preferences', summary: 'Remember the member’s captions choice for every device they play on',
    request: { body: json(playerPreferencesPut, 'Captions on or off') },
    responses: { 200: json(playerPreferencesPut, 'Remembered'), ...errors(400, 401) },
  },
];
