import { billingSettingsInput, promoCreateInput } from '~/lib/api/billing-schemas';
import { parseMoney } from '~/lib/billing/membership-words';
import { createInvitationInput, invitationParams } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { parseWith } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { createPromo, setPromoCodeActive, updateMembershipSettings } from '~/server/use-cases/studio-billing';
import { inviteToTeam, withdrawInvitation } from '~/server/use-cases/team';
import { studioClockInput } from '~/lib/api/studio-schemas';
import { updateStudioClock } from '~/server/use-cases/studio-settings';
import { clockOf } from '~/lib/time/date-format';
import { wallClockToInstant } from '~/lib/time/wall-clock';
import { formAction, formValues } from './form-action';

/** A date picked in the form means "through the end of that day" in the studio's zone; an unreadable one goes on for the schema to refuse. */
function endOfStudioDay(day: string, timeZone: string): string {
  const lastMinute = wallClockToInstant(`${day}T23:59`, timeZone);
  return lastMinute.ok ? new Date(lastMinute.at.getTime() + 59_000).toISOString() : day;
}

export const studioActions = {
  /** "Dates and times" on the studio settings page. */
  updateStudioClock: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const saved = await updateStudioClock(actor, app(), parseWith(studioClockInput, formValues(form)));
    return `Saved. Dates now read in ${saved.timeZone}; scheduled publishes keep their moment.`;
  }),

  /** "Invite someone" on the team page. */
  inviteToTeam: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const inv = await inviteToTeam(actor, app(), parseWith(createInvitationInput, formValues(form)));
    return `Invitation sent to ${inv.email}.`;
  }),

  /** "Withdraw" beside a pending invitation; an id that names no invitation changes nothing. */
  withdrawInvitation: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const id = invitationParams.safeParse({ id: form.get('id') });
    if (id.success) await withdrawInvitation(actor, app(), { id: id.data.id });
    return 'Invitation withdrawn. Its link no longer works.';
  }),

  /** "Membership" on the billing page: price (typed as money), trial and grace days. */
  updateMembershipSettings: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const v = formValues(form);
    const input = parseWith(billingSettingsInput, {
      monthlyPriceMinor: parseMoney(v.monthlyPrice ?? '') ?? Number.NaN,
      trialDays: Number(v.trialDays || 0),
      pastDueGraceDays: Number(v.pastDueGraceDays || 0),
      version: v.version || null,
    });
    await updateMembershipSettings(actor, billingDeps(), input);
    return 'Saved. New members get the new price and trial; current members keep theirs.';
  }),

  /** "New code" on the billing page. */
  createPromo: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const v = formValues(form);
    const input = parseWith(promoCreateInput, {
      code: v.code ?? '',
      percentOff: Number(v.percentOff || Number.NaN),
      expiresAt: v.expiresOn ? endOfStudioDay(v.expiresOn, clockOf(locals.studio).timeZone) : null,
    });
    const p = await createPromo(actor, billingDeps(), input);
    return `Code ${p.code} created: ${p.percentOff}% off the first month.`;
  }),

  /** "Deactivate" / "Activate" beside a promo code. */
  setPromoCodeActive: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const active = form.get('active') === 'true';
    const p = await setPromoCodeActive(actor, billingDeps(), { id: String(form.get('id') ?? ''), active });
    return active ? `Code ${p.code} is active again.` : `Code ${p.code} is deactivated. Members who already used it keep their discount.`;
  }),
};
