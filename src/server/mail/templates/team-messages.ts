import { renderMessage } from './layout';
import type { MailContent } from '../transport';

const ROLE_WORDS = {
  coach: 'a coach: you can create classes, upload and mark recordings, and publish them',
  editor: 'an editor: you can upload recordings, mark segments and cues, and fix what the timing check finds',
} as const;

/** Sent when the owner invites a coach or an editor. */
export function invitationMessage(m: {
  studioName: string;
  inviterName: string | null;
  role: keyof typeof ROLE_WORDS;
  url: string;
  expiresOn: string;
}): MailContent {
  const who = m.inviterName ?? `The team at ${m.studioName}`;
  return renderMessage({
    studioName: m.studioName,
    subject: `${who} invited you to join ${m.studioName} as ${m.role === 'coach' ? 'a coach' : 'an editor'}`,
    preview: `Accept by ${m.expiresOn} to get started.`,
    greeting: 'Hello,',
    paragraphs: [
      `${who} would like you on the team at ${m.studioName}, as ${ROLE_WORDS[m.role]}.`,
      'Open the invitation to accept it. If you are new here, you can create your account on the same page.',
    ],
    action: { label: 'Open the invitation', url: m.url },
    after: [`The invitation is open until ${m.expiresOn}. After that, ask ${m.inviterName ?? 'the studio owner'} to send a new one.`],
    reason: `You are getting this because ${who} entered this address on ${m.studioName}'s team page. If you were not expecting it, ignore this message.`,
  });
}
