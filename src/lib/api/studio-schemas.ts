import { z } from 'zod';
import { isLocale, isTimeZone } from '../time/date-format';
import { accentVerdict, HEX_COLOUR, SLUG_MESSAGES, slugProblem } from '../studios/studio-rules';
import { roles } from './auth-schemas';
import { billingSettingsInput } from './billing-schemas';
import { noControlCharacters } from './text-rules';

/** An IANA time zone name the platform knows ("Europe/Berlin"). */
export const timeZoneField = z
  .string({ error: 'Choose a time zone.' })
  .trim()
  .refine(isTimeZone, { error: 'Choose a time zone from the list, such as Europe/Berlin.' })
  .describe('IANA time zone name; scheduled publishes and dates are read in it');

/** A BCP 47 locale the platform formats dates in ("en-GB"). */
export const localeField = z
  .string({ error: 'Choose a language for dates.' })
  .trim()
  .refine(isLocale, { error: 'Choose a language for dates from the list.' })
  .describe('BCP 47 locale for dates on the studio’s pages and e-mails');

/** The locales offered for dates (the platform formats many more; these read well on our pages). */
export const DATE_LOCALES = [
  { tag: 'en-GB', name: 'English (UK)' },
  { tag: 'en-US', name: 'English (US)' },
  { tag: 'de-DE', name: 'Deutsch' },
  { tag: 'fr-FR', name: 'Français' },
  { tag: 'es-ES', name: 'Español' },
  { tag: 'nl-NL', name: 'Nederlands' },
] as const;

/** The studio's clock on its settings page. */
export const studioClockInput = z
  .object({ timeZone: timeZoneField, locale: localeField })
  .meta({ id: 'StudioClockInput' });
export type StudioClockInput = z.infer<typeof studioClockInput>;

/** Currencies a studio can price in (ISO 4217 codes, lower-case as the payments API takes them). */
export const STUDIO_CURRENCIES = ['eur', 'gbp', 'usd', 'chf', 'sek', 'nok', 'dkk', 'pln', 'cad', 'aud'] as const;

export const studioNameField = z
  .string({ error: 'Name your studio.' })
  .trim()
  .min(2, { error: 'Name your studio (at least 2 characters).' })
  .max(80, { error: 'A studio name has at most 80 characters.' })
  .regex(...noControlCharacters('The studio name'));

export const slugField = z
  .string({ error: 'Choose the studio’s address.' })
  .trim()
  .toLowerCase()
  .superRefine((slug, ctx) => {
    const problem = slugProblem(slug);
    if (problem) ctx.addIssue({ code: 'custom', message: SLUG_MESSAGES[problem] });
  })
  .describe('The studio’s address: /s/{slug}. Lower-case letters, digits and single dashes; some words are reserved.');

export const accentColourField = z
  .string({ error: 'Choose an accent colour.' })
  .trim()
  .regex(HEX_COLOUR, { error: 'Choose a colour like #B93A17.' })
  .superRefine((hex, ctx) => {
    // Zod runs this check even after the pattern failed; only a hex colour has a contrast to judge.
    if (!HEX_COLOUR.test(hex)) return;
    const verdict = accentVerdict(hex);
    if (!verdict.ok)
      ctx.addIssue({
        code: 'custom',
        message: `Text on this colour is hard to read (${verdict.ratio.toFixed(2)}:1 with ${verdict.text} text; WCAG 2.2 AA asks for 4.5:1). Choose a darker or lighter colour.`,
      });
  })
  .transform((hex) => hex.toUpperCase())
  .describe('Hex colour behind button text; white or ink text on it must reach 4.5:1 (WCAG 2.2 AA).');

/** "Start a studio": the studio's own fields (the person's account fields come from SignUpInput). */
export const startStudioInput = z
  .object({
    name: studioNameField,
    slug: slugField,
    timeZone: timeZoneField,
    currency: z.enum(STUDIO_CURRENCIES, { error: 'Choose a currency from the list.' }),
    monthlyPriceMinor: billingSettingsInput.shape.monthlyPriceMinor,
    trialDays: billingSettingsInput.shape.trialDays,
    accentColour: accentColourField,
  })
  .meta({ id: 'StartStudioInput' });
export type StartStudioInput = z.infer<typeof startStudioInput>;

/** The owner's later changes to the studio's name, address and colour. */
export const studioIdentityInput = startStudioInput.pick({ name: true, slug: true, accentColour: true }).meta({ id: 'StudioIdentityInput' });
export type StudioIdentityInput = z.infer<typeof studioIdentityInput>;

/** The studio's name, address, colour and logo after an owner's change. */
export const studioIdentityOutput = z
  .object({
    id: z.uuid(),
    name: z.string(),
    slug: z.string(),
    accentColour: z.string(),
    logoUrl: z.string().nullable().describe('The logo (PNG, at most 256 × 256), or null when the studio has none'),
  })
  .meta({ id: 'StudioIdentity' });

/** A studio as its people see it. */
export const studioOutput = z
  .object({
    id: z.uuid(),
    slug: z.string(),
    name: z.string(),
    timeZone: z.string(),
    locale: z.string(),
    accentColour: z.string(),
    roles: z.array(z.enum(roles)),
  })
  .meta({ id: 'Studio' });
export type StudioOutput = z.infer<typeof studioOutput>;

export const studioListOutput = z.object({ studios: z.array(studioOutput), currentStudioId: z.uuid().nullable() }).meta({ id: 'StudioList' });

/** Choosing the studio staff pages work on, for this session. */
export const currentStudioInput = z.object({ studioId: z.uuid({ error: 'Choose a studio.' }) }).meta({ id: 'CurrentStudioInput' });
