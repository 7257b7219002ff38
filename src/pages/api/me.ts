import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  return json({
    user: { id: user.id, email: user.email, name: user.name },
    studio: locals.studio,
  });
});
