import { firstName, renderMessage } from './layout';
import type { MailContent } from '../transport';

interface Common {
  studioName: string;
  name: string;
}

/** Sent to members who asked to hear about new classes. */
export function classPublishedMessage(
  m: Common & { title: string; coachName: string; minutes: number; description: string | null; url: string; preferencesUrl: string },
): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `New at ${m.studioName}: ${m.title}`,
    preview: `${m.minutes} minutes with ${m.coachName}, ready when you are.`,
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      `${m.coachName} just published a new class: ${m.title}, about ${m.minutes} minutes long.`,
      ...(m.description ? [m.description] : []),
    ],
    action: { label: 'See the class', url: m.url },
    after: [`Not interested in these? Turn them off on your account page: ${m.preferencesUrl}`],
    reason: `You are getting this because you asked ${m.studioName} to tell you about new classes.`,
  });
}

/** Sent once per subscription, two days before its free trial ends. */
export function trialEndingMessage(
  m: Common & { endsOn: string; daysLeft: number; price: string | null; continues: boolean; accountUrl: string },
): MailContent {
  const when = m.daysLeft <= 1 ? 'tomorrow' : `in ${m.daysLeft} days`;
  return renderMessage({
    studioName: m.studioName,
    subject: `Your ${m.studioName} trial ends ${when}`,
    preview: `Your free trial ends on ${m.endsOn}.`,
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      `A quick heads-up: your free trial ends ${when}, on ${m.endsOn}.`,
      m.continues
        ? `After that your membership carries on${m.price ? ` at ${m.price} a month` : ''}, and you keep every class. Nothing to do if that suits you.`
        : 'You have chosen not to continue, so your access stops when the trial ends. You can resume your membership from your account page before then.',
      'To change your plan or cancel, go to your account page.',
    ],
    action: { label: 'Open my account', url: m.accountUrl },
    reason: `You are getting this because you started a free trial at ${m.studioName}.`,
  });
}

/** Sent when the payment provider reports a failed charge. */
export function paymentFailedMessage(m: Common & { graceDays: number | null; accountUrl: string }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `We could not take your ${m.studioName} payment`,
    preview: 'Please check your card on your account page.',
    greeting: `Hi ${firstName(m.name)},`,
    paragraphs: [
      'Your latest membership payment did not go through. This often happens when a card has expired or the bank declined the charge.',
      m.graceDays
        ? `You can keep training for ${m.graceDays} more day${m.graceDays === 1 ? '' : 's'} while you sort it out. Please check your payment details on your account page.`
        : 'Please check your payment details on your account page so your classes stay open.',
    ],
    action: { label: 'Check my payment details', url: m.accountUrl },
    after: ['If you have already updated your card, thank you: there is nothing else to do.'],
    reason: `You are getting this because you have a membership at ${m.studioName}.`,
  });
}
