import type { APIRoute } from 'astro';
import { forgotPasswordInput, forgotPasswordOutput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requestAddress } from '~/server/http/client-address';
import { FORGOT_PASSWORD_ANSWER, requestPasswordReset } from '~/server/services/email-auth';

/** Sends a reset link if the address has an account; the answer is the same either way. */
export const POST: APIRoute = endpoint(async (ctx) => {
  await requestPasswordReset(app(), await readJson(ctx.request, forgotPasswordInput), requestAddress(ctx));
  return answer(forgotPasswordOutput, { message: FORGOT_PASSWORD_ANSWER }, 202);
});
