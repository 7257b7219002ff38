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
