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
