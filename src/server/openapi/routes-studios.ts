import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { currentStudioInput, startStudioInput, studioIdentityInput, studioIdentityOutput, studioListOutput, studioOutput } from '~/lib/api/studio-schemas';
import { studioIdParams } from '~/lib/api/route-params';
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

  {
    method: 'put', path: '/api/studios/{id}', summary: 'Rename the studio, move its address (the old one keeps redirecting and stays taken) and change its accent colour (owner; a studio you are not in answers 404)',
    request: { params: studioIdParams, body: json(studioIdentityInput, 'Name, address and colour') },
    responses: { 200: json(studioIdentityOutput, 'Saved'), ...errors(400, 401, 403, 404, 409, 413) },
  },
  {
    method: 'put', path: '/api/studios/{id}/logo', summary: 'Upload the studio’s logo: PNG, JPEG or WebP, at most 2 MiB (the bytes decide what it is); stored as PNG inside 256 × 256 (owner)',
    request: {
      params: studioIdParams,
      body: { description: 'The picture’s bytes', content: { 'image/png': { schema: z.string().describe('binary') }, 'image/jpeg': { schema: z.string().describe('binary') }, 'image/webp': { schema: z.string().describe('binary') } } },
    },
    responses: { 200: json(studioIdentityOutput, 'Stored'), ...errors(400, 401, 403, 404, 413, 415) },
  },
  {
    method: 'delete', path: '/api/studios/{id}/logo', summary: 'Remove the studio’s logo (owner)',
    request: { params: studioIdParams },
    responses: { 200: json(studioIdentityOutput, 'Removed'), ...errors(401, 403, 404) },
  },
];
