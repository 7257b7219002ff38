import type { APIRoute } from 'astro';
import { emailPreferencesInput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { parseFields } from '~/server/http/form';
import { setEmailPreferences } from '~/server/services/email-preferences';

/** The account page's e-mail choices form: saves, then back to the account page. */
export const POST: APIRoute = async ({ locals, request, redirect }) => {
  const { user, studio } = locals;
  if (!user) return redirect('/sign-in', 303);
  if (!studio) return redirect('/account', 303);
  const form = await request.formData();
  const parsed = parseFields({ newClasses: form.get('newClasses') === 'on' }, emailPreferencesInput);
  if (parsed.ok) await setEmailPreferences(app(), user.id, studio.studioId, parsed.data);
  return redirect('/account?saved=email#email-title', 303);
};
