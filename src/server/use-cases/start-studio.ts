import { eq } from 'drizzle-orm';
import { billingSettings, memberships, studios, users } from '~/db/schema';
import type { SignUpInput } from '~/lib/api/auth-schemas';
import type { StartStudioInput } from '~/lib/api/studio-schemas';
import type { AppDeps } from '../app';
import { isUniqueViolation, prepareAccount } from '../services/accounts';
import { slugInUse, slugTaken } from '../services/studio-identity';

/** Who starts the studio: a signed-in person, or a visitor whose account is made in the same step. */
export type Founder = { userId: string } | { account: SignUpInput; address: string };

export interface StartedStudio {
  studioId: string;
  slug: string;
  userId: string;
}

/**
 * What a visitor's "start a studio" answers: the same for a new address and one that has an
 * account (no session either way; the founder signs in next), so the form tells nobody who has an
 * account. A new address gets its account, the studio and the confirmation e-mail; an address
 * with an account gets nothing made and its owner is e-mailed instead (the sign-up rule).
 */
export type VisitorStart = { kind: 'started'; started: StartedStudio } | { kind: 'mailed-owner' };

/** The path the "someone tried to use your address" mail sends the owner to: start the studio signed in. */
export const START_SIGNED_IN = '/start';

/**
 * "Start a studio": the founder's account (for a visitor), the studio, its membership offer and the
 * founder's owner role are written in one transaction, so a refusal leaves nothing behind. Any
 * person may start a studio: it needs an account, not a role in a studio, so it is not in the
 * per-studio policy table.
 */
export async function startStudio(deps: AppDeps, founder: { userId: string }, input: StartStudioInput): Promise<StartedStudio>;
export async function startStudio(deps: AppDeps, founder: { account: SignUpInput; address: string }, input: StartStudioInput): Promise<VisitorStart>;
export async function startStudio(deps: AppDeps, founder: Founder, input: StartStudioInput): Promise<StartedStudio | VisitorStart> {
  if (await slugInUse(deps, input.slug)) throw slugTaken();
  const visitor = 'account' in founder ? founder : null;
  const account = visitor ? await prepareAccount(deps, visitor.account, visitor.address) : null;
  const mailOwner = async (): Promise<VisitorStart> => {
    await deps.jobs('mail.sign-up-attempt', { email: visitor!.account.email, signInPath: START_SIGNED_IN });
    return { kind: 'mailed-owner' };
  };
  if (visitor && !account) return mailOwner();
  const userId = account ? account.userId : (founder as { userId: string }).userId;
  let studioId: string;
  try {
    studioId = await deps.db.transaction(async (tx) => {
      if (account) await tx.insert(users).values(account.row);
      const [studio] = await tx
        .insert(studios)
        .values({ slug: input.slug, name: input.name, timeZone: input.timeZone, accentColour: input.accentColour })
        .returning({ id: studios.id });
      await tx.insert(memberships).values({ userId, studioId: studio!.id, role: 'owner' });
      await tx.insert(billingSettings).values({ studioId: studio!.id, currency: input.currency, monthlyPriceMinor: input.monthlyPriceMinor, trialDays: input.trialDays });
      return studio!.id;
    });
  } catch (err) {
    // Two founders racing for one address (or one e-mail): the unique index decides.
    if (isUniqueViolation(err)) {
      const taken = await deps.db.query.studios.findFirst({ where: eq(studios.slug, input.slug), columns: { id: true } });
      if (taken || !visitor) throw slugTaken();
      return mailOwner(); // the e-mail was taken meanwhile: answered as any address with an account
    }
    throw err;
  }
  const started = { studioId, slug: input.slug, userId };
  if (!visitor) return started;
  await deps.jobs('mail.verify-email', { userId });
  return { kind: 'started', started };
}
