import type { APIRoute } from 'astro';
import { meOutput } from '~/lib/api/auth-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  return answer(meOutput, {
    user: { id: user.id, email: user.email, name: user.name },
    studio: locals.studio,
  });
});
