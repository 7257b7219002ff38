import { z } from 'zod';
import { isLocale, isTimeZone } from '../time/date-format';

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

