import { eq } from 'drizzle-orm';
import type { NewSession } from '../auth/lucia';
import { billingSettings, memberships, studios, users } from '~/db/schema';
import type { SignUpInput } from '~/lib/api/auth-schemas';
import type { StartStudioInput } from '~/lib/api/studio-schemas';
import { AppError } from '../errors';
import type { AppDeps } from '../app';
import { isUniqueViolation, openFirstSession, prepareAccount } from '../services/accounts';
import { slugInUse, slugTaken } from '../services/studio-identity';

/** Who starts the studio: a signed-in person, or a visitor whose account is made in the same step. */
export type Founder = { userId: string } | { account: SignUpInput; address: string };

export interface StartedStudio {
  studioId: string;
  slug: string;
  userId: string;
  /** Set when the founder was a visitor: the new account's first session, working in the new studio. */
  session?: NewSession;
}

/**
 * "Start a studio": the founder's account (for a visitor), the studio, its membership offer and the
 * founder's owner role are written in one transaction, so a refusal leaves nothing behind. Any
 * person may start a studio: it needs an account, not a role in a studio, so it is not in the
 * per-studio policy table.
 */
export async function startStudio(deps: AppDeps, founder: Founder, input: StartStudioInput): Promise<StartedStudio> {
  if (await slugInUse(deps, input.slug)) throw slugTaken();
  const account = 'account' in founder ? await prepareAccount(deps, founder.account, founder.address) : null;
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
      if (taken || !account) throw slugTaken();
      throw new AppError('conflict', 'An account with this e-mail already exists. Sign in instead.', { email: 'An account with this e-mail already exists. Sign in instead.' });
    }
    throw err;
  }
  const session = account ? await openFirstSession(deps, userId, studioId) : undefined;
  return { studioId, slug: input.slug, userId, session };
}
