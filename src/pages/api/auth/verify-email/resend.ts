import type { APIRoute } from 'astro';
import { resendVerificationOutput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { sendVerificationLink } from '~/server/services/email-auth';

/** Sends a new "confirm your address" link to the signed-in person (no body). */
export const POST: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  const status = await sendVerificationLink(app(), user.id);
  return answer(resendVerificationOutput, { status }, status === 'sent' ? 202 : 200);
});
