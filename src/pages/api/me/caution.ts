import type { APIRoute } from 'astro';
import { cautionOutput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { acknowledgeCaution } from '~/server/services/member-classes';

/** Records that the member read the general exercise caution before their first play. */
export const POST: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  await acknowledgeCaution(app(), user.id);
  return answer(cautionOutput, { acknowledged: true });
});
