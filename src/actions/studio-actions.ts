import { billingSettingsInput, promoCreateInput } from '~/lib/api/billing-schemas';
import { parseMoney } from '~/lib/billing/membership-words';
import { createInvitationInput, invitationParams } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { parseWith } from '~/server/http/api';
import { requireActor, requireUser } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { createPromo, setPromoCodeActive, updateMembershipSettings } from '~/server/use-cases/studio-billing';
import { inviteToTeam, withdrawInvitation } from '~/server/use-cases/team';
import { studioClockInput, studioIdentityInput } from '~/lib/api/studio-schemas';
import { changeStudioIdentity, deleteStudioLogo, updateStudioClock, uploadStudioLogo } from '~/server/use-cases/studio-settings';
import { AppError } from '~/server/errors';
import { storage } from '~/server/storage';
import { MAX_LOGO_UPLOAD_BYTES } from '~/lib/studios/studio-logo';
import { connectPayments } from '~/server/use-cases/studio-payments';
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

  /** "Name, address and colour" on the studio settings page. */
  updateStudioIdentity: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const saved = await changeStudioIdentity(actor, app(), parseWith(studioIdentityInput, formValues(form)));
    if (locals.studio) locals.studio = { ...locals.studio, studioName: saved.name, studioSlug: saved.slug }; // this page's header
    return `Saved. Your studio’s address is /s/${saved.slug}; links to an address it had before lead there too.`;
  }),

  /** "Logo" on the studio settings page: the chosen file, checked by its bytes. */
  uploadStudioLogo: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const file = form.get('logo');
    if (!(file instanceof File) || file.size === 0) throw new AppError('invalid_input', 'Choose a picture file for the logo.', { logo: 'Choose a .png, .jpg or .webp picture.' });
    if (file.size > MAX_LOGO_UPLOAD_BYTES) throw new AppError('too_large', 'That picture is larger than 2 MB. Choose a smaller file.', { logo: 'At most 2 MB.' });
    const saved = await uploadStudioLogo(actor, app(), storage(), new Uint8Array(await file.arrayBuffer()));
    if (locals.studio) locals.studio = { ...locals.studio, logoUrl: saved.logoUrl };
    return 'Logo saved. It shows in the header and on your studio’s page.';
  }),

  /** "Remove logo" on the studio settings page. */
  removeStudioLogo: formAction(async (_form, { locals }) => {
    await deleteStudioLogo(requireActor(locals), app(), storage());
    if (locals.studio) locals.studio = { ...locals.studio, logoUrl: null };
    return 'Logo removed.';
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

  /** "Connect payments" / "Continue setup" in the Payments section: answers the provider's onboarding page to go to. */
  connectPayments: formAction(async (_form, { locals }) => {
    const actor = requireActor(locals);
    const { url } = await connectPayments(actor, billingDeps(), { ownerEmail: requireUser(locals).user.email });
    return url;
  }),

  /** "Deactivate" / "Activate" beside a promo code. */
  setPromoCodeActive: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const active = form.get('active') === 'true';
    const p = await setPromoCodeActive(actor, billingDeps(), { id: String(form.get('id') ?? ''), active });
    return active ? `Code ${p.code} is active again.` : `Code ${p.code} is deactivated. Members who already used it keep their discount.`;
  }),
};
