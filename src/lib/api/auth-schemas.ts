import { z } from 'zod';
import { noControlCharacters } from './text-rules';

/** E-mail as typed by a person: trimmed and lower-cased before use. */
export const emailField = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter an e-mail address like name@example.com.' }));

/** New passwords: long enough to resist guessing, short enough for argon2 to stay cheap. */
export const newPasswordField = z
  .string({ error: 'Choose a password.' })
  .min(10, { error: 'Use at least 10 characters.' })
  .max(200, { error: 'Use at most 200 characters.' });

export const signInInput = z
  .object({
    email: emailField,
    password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200),
  })
  .meta({ id: 'SignInInput' });
export type SignInInput = z.infer<typeof signInInput>;

export const signUpInput = z
  .object({
    name: z.string({ error: 'Tell us your name.' }).trim().min(1, { error: 'Tell us your name.' }).max(120).regex(...noControlCharacters('Your name')),
    email: emailField,
    password: newPasswordField,
  })
  .meta({ id: 'SignUpInput' });
export type SignUpInput = z.infer<typeof signUpInput>;

export const changePasswordInput = z
  .object({
    currentPassword: z.string().min(1, { error: 'Enter your current password.' }).max(200),
    newPassword: newPasswordField,
    signOutOthers: z.boolean().default(true),
  })
  .meta({ id: 'ChangePasswordInput' });
export type ChangePasswordInput = z.infer<typeof changePasswordInput>;

export const roles = ['owner', 'coach', 'editor', 'member'] as const;
export type Role = (typeof roles)[number];

/**
 * Sign-up answers the same whether or not the address already has an account (no session, no id),
 * so the form cannot be used to find out who has one.
 */
export const signUpOutput = z
  .object({ message: z.string().describe('The same answer for a new address and one that already has an account') })
  .meta({ id: 'SignUpOutput' });

/** Sign-in answers who signed in and where their home page is. */
export const signedInOutput = z.object({ userId: z.string(), home: z.string().describe('Path of the person’s home page') }).meta({ id: 'SignedIn' });
export type SignedInOutput = z.infer<typeof signedInOutput>;

export const signOutQuery = z.object({ everywhere: z.enum(['1']).optional().describe('1 ends every session of the account') });
export const signedOutOutput = z.object({ signedOut: z.boolean() }).meta({ id: 'SignedOut' });

/** `GET /api/me`: the signed-in person and their roles in the current studio (null outside one). */
export const meOutput = z
  .object({
    user: z.object({ id: z.string(), email: z.string(), name: z.string() }),
    studio: z.object({ studioId: z.string(), studioSlug: z.string(), studioName: z.string(), timeZone: z.string().describe('IANA time zone the studio reads dates in'), locale: z.string().describe('BCP 47 locale of its dates'), logoUrl: z.string().nullable().describe('The studio’s logo, or null'), roles: z.array(z.enum(roles)) }).nullable(),
  })
  .meta({ id: 'Me' });
export type MeOutput = z.infer<typeof meOutput>;

/** `POST /api/me/caution`: the member read the general exercise caution. */
export const cautionOutput = z.object({ acknowledged: z.boolean() }).meta({ id: 'CautionAcknowledged' });
