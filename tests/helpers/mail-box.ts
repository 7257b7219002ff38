// Reads what docker-free-dev/mail-fake.mjs stored: index.jsonl (one line per message) and the
// raw .eml files beside it. For tests only; the app never reads the mail folder.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

/** One line of index.jsonl, as written by the mail fake. */
export interface MailIndexEntry {
  /** .eml file name inside the mail folder; names sort by arrival. */
  file: string;
  /** Envelope sender (MAIL FROM). */
  from: string;
  /** Envelope recipients (RCPT TO), including Bcc ones. */
  to: string[];
  subject: string | null;
  /** Arrival time, ISO 8601. */
  date: string;
}

export interface StoredMail {
  entry: MailIndexEntry;
  raw: Buffer;
  parsed: ParsedMail;
}

/** The folder the mail fake writes to: $ROUNDMARK_MAIL_DIR or .data/mail in the checkout. */
export function mailDir(): string {
  return path.resolve(process.env.ROUNDMARK_MAIL_DIR ?? '.data/mail');
}

/** Every stored message in arrival order (empty when nothing arrived yet). */
export async function listMessages(dir = mailDir()): Promise<MailIndexEntry[]> {
  let text: string;
  try {
    text = await readFile(path.join(dir, 'index.jsonl'), 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  const entries: MailIndexEntry[] = [];
  for (const line of text.split('\n')) {
    if (!line.trim()) continue;
    try {
      entries.push(JSON.parse(line) as MailIndexEntry);
    } catch {
      // Only a line still being appended can be incomplete; the next poll sees it whole.
    }
  }
  return entries.sort((a, b) => a.file.localeCompare(b.file));
}

/** Reads and parses one stored message. */
export async function readMessage(entry: MailIndexEntry, dir = mailDir()): Promise<StoredMail> {
  const raw = await readFile(path.join(dir, entry.file));
  return { entry, raw, parsed: await simpleParser(raw) };
}

export interface WaitOptions {
  /** Give up after this long (default 10 s). */
  timeoutMs?: number;
  /** Only messages that arrived at or after this time. */
  since?: Date;
  /** Extra condition on the index entry, e.g. a subject check. */
  match?: (entry: MailIndexEntry) => boolean;
  dir?: string;
}

/**
 * Polls the mail folder until a message to `address` arrives (case-insensitive), then returns
 * it parsed. The newest matching message wins. Throws after the timeout, naming what it saw.
 */
export async function waitForMessage(address: string, options: WaitOptions = {}): Promise<StoredMail> {
  const { timeoutMs = 10_000, since, match, dir = mailDir() } = options;
  const wanted = address.toLowerCase();
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await listMessages(dir)).filter(
      (entry) =>
        entry.to.some((to) => to.toLowerCase() === wanted) &&
        (!since || Date.parse(entry.date) >= since.getTime()) &&
        (!match || match(entry)),
    );
    const newest = found.at(-1);
    if (newest) return readMessage(newest, dir);
    if (Date.now() >= deadline) {
      throw new Error(`No message to ${address} in ${dir} within ${timeoutMs} ms`);
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}
