import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { readStudioLogo } from '~/server/services/studio-identity';
import { storage } from '~/server/storage';

/**
 * A studio's logo, for everyone (its public page shows it to visitors). Every upload gets a new
 * file name, so a copy may be kept for a year; an old name answers 404.
 */
export const GET: APIRoute = endpoint(async ({ params }) => {
  const bytes = await readStudioLogo(app(), storage(), params.id!, params.file ?? '');
  return new Response(Buffer.from(bytes), {
    headers: { 'content-type': 'image/png', 'cache-control': 'public, max-age=31536000, immutable', 'x-content-type-options': 'nosniff' },
  });
});
