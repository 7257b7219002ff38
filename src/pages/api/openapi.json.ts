import type { APIRoute } from 'astro';
import { json } from '~/server/http/api';
import { openApiDocument } from '~/server/openapi/document';

let cached: unknown;

export const GET: APIRoute = () => {
  cached ??= openApiDocument();
  return json(cached, 200, { 'cache-control': 'public, max-age=300' });
};
