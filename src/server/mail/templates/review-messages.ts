import { renderMessage } from './layout';
import type { MailContent } from '../transport';

/** Sent to the studio's coaches and owner when someone marks a class ready for review. */
export function reviewRequestedMessage(m: { studioName: string; name: string; preparedBy: string; title: string; note: string; url: string }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `${m.preparedBy} marked “${m.title}” ready for review`,
    preview: m.note ? m.note.slice(0, 90) : 'Open the class to check it and publish.',
    greeting: `Hello ${m.name},`,
    paragraphs: [
      `${m.preparedBy} prepared “${m.title}” and marked it ready for review.`,
      m.note ? `Their note: “${m.note}”` : 'They left no note.',
      'Open the class to watch the marked recording, look at the timing check, and publish it when you are happy, or send it back with a note saying what needs another look.',
    ],
    action: { label: 'Open the class', url: m.url },
    reason: `You are getting this because you are a coach or the owner at ${m.studioName}.`,
  });
}

/** Sent to whoever prepared a class when a coach or the owner sends it back with a note. */
export function reviewSentBackMessage(m: { studioName: string; name: string; sentBy: string; title: string; note: string; url: string }): MailContent {
  return renderMessage({
    studioName: m.studioName,
    subject: `${m.sentBy} sent “${m.title}” back for changes`,
    preview: m.note.slice(0, 90),
    greeting: `Hello ${m.name},`,
    paragraphs: [
      `${m.sentBy} reviewed “${m.title}” and sent it back to you.`,
      `What needs another look: “${m.note}”`,
      'Make the changes, then mark the class ready for review again.',
    ],
    action: { label: 'Open the class', url: m.url },
    reason: `You are getting this because you marked this class ready for review at ${m.studioName}.`,
  });
}
