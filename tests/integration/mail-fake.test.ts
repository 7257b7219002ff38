// The local SMTP fake (docker-free-dev/mail-fake.mjs) keeps every message it receives as an
// .eml file with an index line. Sends through nodemailer to the running fake; nothing mocked.
import { randomUUID } from 'node:crypto';
import { readdir } from 'node:fs/promises';
import { afterAll, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { listMessages, mailDir, waitForMessage } from '../helpers/mail-box';

const smtpUrl = process.env.SMTP_URL ?? `smtp://127.0.0.1:${process.env.ROUNDMARK_SMTP_PORT ?? 2526}`;
const transport = nodemailer.createTransport(smtpUrl);

/** A fresh address per test so messages from earlier runs never match. */
const freshAddress = (who: string) => `${who}-${randomUUID().slice(0, 8)}@members.example`;

afterAll(() => transport.close());

describe('mail fake', () => {
  it('stores a sent message as an .eml that parses back with its subject, recipients and text', async () => {
    const to = freshAddress('ada');
    const since = new Date(Date.now() - 1000);
    const subject = 'Your class “Morning Mobility — 20 min” is ready';
    const text = 'Hello Ada,\n\nYour recording finished processing.\nSee you on the mat!\n';
    const info = await transport.sendMail({
      from: 'Fernhill Movement Co. <hello@fernhill.example>',
      to: `Ada Lovelace <${to}>`,
      subject,
      text,
    });
    expect(info.accepted).toEqual([to]);

    const mail = await waitForMessage(to, { since, timeoutMs: 5000 });
    expect(mail.entry.file).toMatch(/^\d{8}T\d{9}Z-\d{6}\.eml$/);
    expect(mail.entry.from).toBe('hello@fernhill.example');
    expect(mail.entry.to).toEqual([to]);
    expect(mail.entry.subject).toBe(subject);
    expect(Number.isNaN(Date.parse(mail.entry.date))).toBe(false);

    expect(mail.parsed.subject).toBe(subject);
    expect(mail.parsed.text?.replace(/\r\n/g, '\n').trim()).toBe(text.trim());
    const toHeader = Array.isArray(mail.parsed.to) ? mail.parsed.to[0] : mail.parsed.to;
    expect(toHeader?.value).toEqual([{ address: to, name: 'Ada Lovelace' }]);
    expect(mail.parsed.from?.value[0]?.address).toBe('hello@fernhill.example');
    expect(mail.raw.toString('latin1')).toContain(`Message-ID: ${info.messageId}`);
  });

  it('records each envelope recipient, Bcc included, in the index', async () => {
    const to = freshAddress('grace');
    const bcc = freshAddress('owner');
    await transport.sendMail({ from: 'hello@fernhill.example', to, bcc, subject: 'Receipt', text: 'Thanks!' });

    const forBcc = await waitForMessage(bcc, { timeoutMs: 5000 });
    expect(forBcc.entry.to).toEqual([to, bcc]);
    // The Bcc header is not in the message itself.
    expect(forBcc.raw.toString('latin1')).not.toContain(bcc);
  });

  it('names files so that they sort by arrival, one index line per .eml', async () => {
    const to = freshAddress('linus');
    for (const n of [1, 2, 3]) {
      await transport.sendMail({ from: 'hello@fernhill.example', to, subject: `Message ${n}`, text: `n=${n}` });
    }
    await waitForMessage(to, { match: (e) => e.subject === 'Message 3', timeoutMs: 5000 });

    const mine = (await listMessages()).filter((entry) => entry.to.includes(to));
    expect(mine.map((entry) => entry.subject)).toEqual(['Message 1', 'Message 2', 'Message 3']);
    const files = mine.map((entry) => entry.file);
    expect([...files].sort()).toEqual(files);

    const onDisk = new Set((await readdir(mailDir())).filter((name) => name.endsWith('.eml')));
    for (const file of files) expect(onDisk.has(file)).toBe(true);
  });

  it('times out plainly when no message comes', async () => {
    await expect(waitForMessage(freshAddress('nobody'), { timeoutMs: 300 })).rejects.toThrow(/No message to nobody-/);
  });
});
