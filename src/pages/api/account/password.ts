import type { APIRoute } from 'astro';
import { changePasswordInput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { changePassword } from '~/server/services/accounts';

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { user, session } = requireUser(locals);
  await changePassword(app(), user.id, session.id, await readJson(request, changePasswordInput));
  return new Response(null, { status: 204 });
});
