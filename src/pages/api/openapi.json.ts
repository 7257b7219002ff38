import type { APIRoute } from 'astro';
import { apiDocumentOutput } from '~/lib/api/service-schemas';
import { answer } from '~/server/http/api';
import { openApiDocument } from '~/server/openapi/document';

/** Built once per process: the schemas do not change while it runs. */
let cached: Record<string, unknown> | undefined;

export const GET: APIRoute = () => {
  cached ??= { ...openApiDocument() };
  return answer(apiDocumentOutput, cached, 200, { 'cache-control': 'public, max-age=300' });
};
