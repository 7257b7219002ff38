import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { currentStudioInput, startStudioInput, studioListOutput, studioOutput } from '~/lib/api/studio-schemas';
import { errors, json } from './responses';

/** Studios a person belongs to, starting one, and choosing the one a session works in. */
export const studioRoutes: RouteConfig[] = [
  {
    method: 'get', path: '/api/studios', summary: 'The studios you belong to, with your roles, and the one this session works in',
    responses: { 200: json(studioListOutput, 'Your studios'), ...errors(401) },
  },
  {
    method: 'post', path: '/api/studios', summary: 'Start a studio: you become its owner and this session works in it',
    request: { body: json(startStudioInput, 'The new studio') },
    responses: { 201: json(studioOutput, 'Started'), ...errors(400, 401, 409, 413) },
  },
  {
    method: 'put', path: '/api/me/studio', summary: 'Choose the studio this session works in (one you belong to; any other answers 404)',
    request: { body: json(currentStudioInput, 'The studio') },
    responses: { 200: json(studioOutput, 'Working in it now'), ...errors(400, 401, 404, 413) },
  },
];
