import type { APIRoute } from 'astro';
import { signedInOutput, signUpInput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { setSessionCookie } from '~/server/http/session-cookie';
import { requestAddress } from '~/server/http/client-address';
import { signUp } from '~/server/services/accounts';

export const POST: APIRoute = endpoint(async (ctx) => {
  const { request, cookies } = ctx;
  const input = await readJson(request, signUpInput);
  const deps = app();
  const { userId, session } = await signUp(deps, input, requestAddress(ctx));
  setSessionCookie(cookies, deps.auth, session);
  return answer(signedInOutput, { userId, home: '/library' }, 201);
});
