import { signUpInput } from '~/lib/api/auth-schemas';
import { currentStudioInput, startStudioInput } from '~/lib/api/studio-schemas';
import { parseMoney } from '~/lib/billing/membership-words';
import { app } from '~/server/app';
import { AppError } from '~/server/errors';
import { parseWith } from '~/server/http/api';
import { requestAddress } from '~/server/http/client-address';
import { requireUser } from '~/server/http/guards';
import { chooseStudio } from '~/server/services/accounts';
import { startStudio } from '~/server/use-cases/start-studio';
import { formAction, formValues } from './form-action';

/** What a visitor who started a studio is told, whether or not the address had an account. */
export const START_ANSWER =
  'Thanks! Check your inbox: we have sent a message to that address. Sign in with your e-mail and password to open your studio’s first-class checklist.';

/** Where the founder lands: the first-class checklist. */
export const WELCOME_PATH = '/studio/welcome';

/** The founder's account fields; the form calls the person's name `ownerName` (`name` is the studio's). */
function parseAccount(v: Record<string, string>) {
  try {
    return parseWith(signUpInput, { name: v.ownerName, email: v.email, password: v.password });
  } catch (err) {
    if (err instanceof AppError && err.fields?.name) {
      const { name, ...rest } = err.fields;
      throw new AppError(err.code, err.message, { ...rest, ownerName: name });
    }
    throw err;
  }
}

export const studioEntryActions = {
  /** The studio switcher (header) and the chooser page: this session works in that studio. */
  chooseStudio: formAction(async (form, { locals }) => {
    const { user, session } = requireUser(locals);
    const { studioId } = parseWith(currentStudioInput, formValues(form));
    const access = await chooseStudio(app(), { sessionId: session.id, userId: user.id }, studioId);
    return access.roles.some((r) => r !== 'member') ? '/studio' : `/s/${access.studioSlug}/library`;
  }),

  /** "Start a studio": a visitor also fills in their account; a signed-in person only the studio. */
  startStudio: formAction(async (form, ctx) => {
    const deps = app();
    const v = formValues(form);
    const input = parseWith(startStudioInput, {
      ...v,
      monthlyPriceMinor: parseMoney(v.monthlyPrice ?? '') ?? Number.NaN,
      trialDays: v.trialDays === undefined || v.trialDays === '' ? Number.NaN : Number(v.trialDays),
    });
    const { user, session } = ctx.locals;
    if (user && session) {
      const started = await startStudio(deps, { userId: user.id }, input);
      await chooseStudio(deps, { sessionId: session.id, userId: user.id }, started.studioId);
      return { goTo: WELCOME_PATH };
    }
    // A visitor: the same answer whether or not the address has an account (no session); they sign in next.
    await startStudio(deps, { account: parseAccount(v), address: requestAddress(ctx) }, input);
    return { sent: START_ANSWER };
  }),
};
