import { firstName, renderMessage } from './layout';
import type { MailContent } from '../transport';

interface Common {
  studioName: string;
  name: string;
}

/** Sent on sign-up and on "send the link again". */
export function verifyEmailMessage(m: Common & { url: string; validHours: number }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `Confirm your e-mail address for ${m.studioName}`,
    preview: 'One click and your account is all set.',
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      `Welcome to ${m.studioName}. Please confirm that this is your e-mail address, so we can reach you about your membership and help you back in if you ever forget your password.`,
    ],
    action: { label: 'Confirm my address', url: m.url },
    after: [`The link works for ${m.validHours} hours. You can already browse the classes in the meantime.`],
    reason: `You are getting this because someone created an account at ${m.studioName} with this address. If it was not you, ignore this message and nothing will happen.`,
  });
}

/** Sent instead of a new account when someone signs up with an address that already has one. */
export function signUpAttemptMessage(m: Common & { signInUrl: string; resetUrl: string }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `Someone tried to create a ${m.studioName} account with your address`,
    preview: 'You already have an account: sign in, or choose a new password.',
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      'Someone just tried to create an account with this e-mail address, but you already have one, so no new account was made.',
      'If it was you, sign in with your password, or choose a new password if you no longer remember it.',
    ],
    action: { label: 'Sign in', url: m.signInUrl },
    after: [`Forgot your password? Choose a new one here: ${m.resetUrl}`],
    reason: `You are getting this because someone entered this address on the sign-up form at ${m.studioName}. If it was not you, ignore this message: nothing about your account changed.`,
  });
}

/** Sent from the "Forgot your password?" form. */
export function passwordResetMessage(m: Common & { url: string; validMinutes: number }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `Reset your ${m.studioName} password`,
    preview: 'Choose a new password with the link inside.',
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      'We got a request to reset the password of your account. Choose a new one with the link below.',
      'When you save it, every device signed in to your account is signed out, so you start fresh.',
    ],
    action: { label: 'Choose a new password', url: m.url },
    after: [`The link works once, for ${m.validMinutes} minutes.`],
    reason: `You are getting this because someone asked to reset the password for this address at ${m.studioName}. If it was not you, ignore this message: your password stays as it is.`,
  });
}
