import type { APIRoute } from 'astro';
import { signUpInput, signUpOutput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requestAddress } from '~/server/http/client-address';
import { SIGN_UP_ANSWER, signUp } from '~/server/services/accounts';

/** Creates an account; answers the same (202, no session) when the address already has one. */
export const POST: APIRoute = endpoint(async (ctx) => {
  await signUp(app(), await readJson(ctx.request, signUpInput), requestAddress(ctx));
  return answer(signUpOutput, { message: SIGN_UP_ANSWER }, 202);
});
