import type { APIRoute } from 'astro';
import { signedInOutput, signInInput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { setSessionCookie } from '~/server/http/session-cookie';
import { homeAfterSignIn } from '~/server/http/guards';
import { requestAddress } from '~/server/http/client-address';
import { resolveStudio, signIn } from '~/server/services/accounts';

export const POST: APIRoute = endpoint(async (ctx) => {
  const { request, cookies } = ctx;
  const input = await readJson(request, signInInput);
  const deps = app();
  const session = await signIn(deps, input, requestAddress(ctx));
  setSessionCookie(cookies, deps.auth, session);
  return answer(signedInOutput, { userId: session.userId, home: homeAfterSignIn(await resolveStudio(deps, session.userId)) });
});
