import nodemailer, { type Transporter } from 'nodemailer';
import { env } from '../env';

/** One message as the templates build it: both parts always, so every mail client has something to show. */
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

export interface OutgoingMail extends MailContent {
  to: { name: string; address: string };
  /**
   * The studio the message is sent for: its name is the sender's name, so members see their studio
   * rather than our product; its id goes in STUDIO_HEADER so the captured-mail page can show each
   * owner only their own studio's messages.
   */
  studio: { id: string; name: string };
}

/** Names the studio a message was sent for (our own header; RFC 6648 advises against an X- prefix). */
export const STUDIO_HEADER = 'Roundmark-Studio';

let shared: Transporter | undefined;

/** The process-wide SMTP transport, built from SMTP_URL on first use (the local mail fake in development and tests). */
export function mailTransport(): Transporter {
  shared ??= nodemailer.createTransport(env().SMTP_URL);
  return shared;
}

/** MAIL_FROM's address part ("Name <a@b>" or a bare address). */
export function fromAddress(mailFrom = env().MAIL_FROM): string {
  const m = /<([^>]+)>/.exec(mailFrom);
  return (m?.[1] ?? mailFrom).trim();
}

/** Sends one message; throws when the SMTP server refuses it, so jobs retry and callers can decide. */
export async function deliver(mail: OutgoingMail): Promise<string> {
  const info = await mailTransport().sendMail({
    from: { name: mail.studio.name, address: fromAddress() },
    headers: { [STUDIO_HEADER]: mail.studio.id },
    to: { name: mail.to.name, address: mail.to.address },
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
  });
  return info.messageId;
}
