import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { settings } from '../env';
import { STUDIO_HEADER } from '../mail/transport';

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

/** The fake's file names only (arrival time and counter), so no other file can be asked for. */
const FILE_NAME = /^\d{8}T\d{9}Z-\d{6}\.eml$/;
const STUDIO_LINE = new RegExp(`^${STUDIO_HEADER}:[ \\t]*(\\S+)`, 'im');

/** The studio a stored message was sent for (our header); null when it names none. */
function studioOf(raw: Buffer): string | null {
  const text = raw.toString('utf8');
  const end = text.search(/\r?\n\r?\n/);
  return STUDIO_LINE.exec(end < 0 ? text : text.slice(0, end))?.[1] ?? null;
}

async function readStored(file: string): Promise<Buffer | null> {
  if (!FILE_NAME.test(file)) return null;
  try {
    return await readFile(path.join(mailDir(), file));
  } catch {
    return null;
  }
}

/**
 * One studio's messages, newest first, at most `limit`. Each message names its studio in a
 * header, so another studio's mail (and mail sent for none) is never listed.
 */
export async function listCapturedMail(studioId: string, limit = 200): Promise<CapturedMailEntry[]> {
  const mine: CapturedMailEntry[] = [];
  for (const entry of await allCapturedMail()) {
    const raw = await readStored(entry.file);
    if (raw && studioOf(raw) === studioId) mine.push(entry);
    if (mine.length >= limit) break;
  }
  return mine;
}

/** Every entry of the fake's index, newest first. */
async function allCapturedMail(): Promise<CapturedMailEntry[]> {
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
  return entries.sort((a, b) => b.file.localeCompare(a.file));
}

export interface CapturedMail {
  file: string;
  subject: string;
  from: string;
  to: string;
  date: string;
  text: string;
  html: string | null;
}

/**
 * One stored message of this studio, parsed; null when the name is not one of the fake's, the
 * file is gone, or the message was sent for another studio.
 */
export async function readCapturedMail(studioId: string, file: string): Promise<CapturedMail | null> {
  const raw = await readStored(file);
  if (!raw || studioOf(raw) !== studioId) return null;
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
