import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { settings } from '../env';

// Reads what the local SMTP fake (docker-free-dev/mail-fake.mjs) stored, for the owner's
// preview page in development and tests. Production never sets ROUNDMARK_MAIL_PREVIEW, so the
// page answers 404 there and this folder is never read.

/** Whether the captured-mail preview is switched on (docker-free-dev/start-app.sh and run-tests.sh set it). */
export function mailPreviewEnabled(): boolean {
  return settings().ROUNDMARK_MAIL_PREVIEW;
}

function mailDir(): string {
  return path.resolve(settings().ROUNDMARK_MAIL_DIR);
}

export interface CapturedMailEntry {
  file: string;
  to: string[];
  subject: string | null;
  date: string;
}

/** Newest first, at most `limit`. */
export async function listCapturedMail(limit = 200): Promise<CapturedMailEntry[]> {
  let text: string;
  try {
    text = await readFile(path.join(mailDir(), 'index.jsonl'), 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  const entries: CapturedMailEntry[] = [];
  for (const line of text.split('\n')) {
    if (!line.trim()) continue;
    try {
      const e = JSON.parse(line) as CapturedMailEntry;
      entries.push({ file: e.file, to: e.to, subject: e.subject, date: e.date });
    } catch {
      // A line still being appended; the next look sees it whole.
    }
  }
  return entries.sort((a, b) => b.file.localeCompare(a.file)).slice(0, limit);
}

/** The fake's file names only (arrival time and counter), so no other file can be asked for. */
const FILE_NAME = /^\d{8}T\d{9}Z-\d{6}\.eml$/;

export interface CapturedMail {
  file: string;
  subject: string;
  from: string;
  to: string;
  date: string;
  text: string;
  html: string | null;
}

/** One stored message, parsed; null when the name is not one of the fake's or the file is gone. */
export async function readCapturedMail(file: string): Promise<CapturedMail | null> {
  if (!FILE_NAME.test(file)) return null;
  let raw: Buffer;
  try {
    raw = await readFile(path.join(mailDir(), file));
  } catch {
    return null;
  }
  // mailparser is a development dependency: loaded only when the preview is on.
  const { simpleParser } = await import('mailparser');
  const parsed = await simpleParser(raw);
  const to = Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(', ') : (parsed.to?.text ?? '');
  return {
    file,
    subject: parsed.subject ?? '(no subject)',
    from: parsed.from?.text ?? '',
    to,
    date: (parsed.date ?? new Date()).toISOString(),
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
  };
}
