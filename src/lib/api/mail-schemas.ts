import { z } from 'zod';
import { noControlCharacters } from './text-rules';
import { emailField, newPasswordField } from './auth-schemas';

/** A token from an e-mailed link, as it arrives in a form or a JSON body. */
const tokenField = z
  .string({ error: 'This link is incomplete. Open it again from the e-mail.' })
  .trim()
  .min(20, { error: 'This link is incomplete. Open it again from the e-mail.' })
  .max(200, { error: 'This link is incomplete. Open it again from the e-mail.' });

export const forgotPasswordInput = z
  .object({ email: emailField })
  .meta({ id: 'ForgotPasswordInput' });
export type ForgotPasswordInput = z.infer<typeof forgotPasswordInput>;

export const forgotPasswordOutput = z
  .object({ message: z.string().describe('The same answer whether or not the address has an account') })
  .meta({ id: 'ForgotPasswordOutput' });

export const resetPasswordInput = z
  .object({ token: tokenField, newPassword: newPasswordField })
  .meta({ id: 'ResetPasswordInput' });
export type ResetPasswordInput = z.infer<typeof resetPasswordInput>;

export const resendVerificationOutput = z
  .object({ status: z.enum(['sent', 'already-verified']) })
  .meta({ id: 'ResendVerificationOutput' });

export const staffInviteRoles = ['coach', 'editor'] as const;

export const createInvitationInput = z
  .object({
    email: emailField,
    role: z.enum(staffInviteRoles, { error: 'Choose coach or editor.' }),
  })
  .meta({ id: 'CreateInvitationInput' });
export type CreateInvitationInput = z.infer<typeof createInvitationInput>;

export const invitationOutput = z
  .object({
    id: z.string().uuid(),
    email: z.string(),
    role: z.enum(staffInviteRoles),
    expiresAt: z.string().describe('ISO 8601; the invitation cannot be accepted after this'),
    createdAt: z.string(),
  })
  .meta({ id: 'Invitation' });
export type InvitationOutput = z.infer<typeof invitationOutput>;

export const invitationParams = z.object({ id: z.string().uuid({ error: 'That invitation could not be found.' }) });

/** A new person's details when they create their account from an invitation (the e-mail comes from the invitation). */
export const acceptAsNewAccountInput = z
  .object({
    name: z.string({ error: 'Tell us your name.' }).trim().min(1, { error: 'Tell us your name.' }).max(120).regex(...noControlCharacters('Your name')),
    password: newPasswordField,
  })
  .meta({ id: 'AcceptAsNewAccountInput' });
export type AcceptAsNewAccountInput = z.infer<typeof acceptAsNewAccountInput>;

export const emailPreferencesInput = z
  .object({ newClasses: z.boolean() })
  .meta({ id: 'EmailPreferencesInput' });
export type EmailPreferencesInput = z.infer<typeof emailPreferencesInput>;

export const invitationListOutput = z.object({ invitations: z.array(invitationOutput) }).meta({ id: 'Invitations' });
