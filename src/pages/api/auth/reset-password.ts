import type { APIRoute } from 'astro';
import { resetPasswordInput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { endpoint, readJson } from '~/server/http/api';
import { resetPassword } from '~/server/services/email-auth';

/** Sets a new password from a reset link's token; every session of the account is signed out. */
export const POST: APIRoute = endpoint(async ({ request }) => {
  await resetPassword(app(), await readJson(request, resetPasswordInput));
  return new Response(null, { status: 204 });
});
