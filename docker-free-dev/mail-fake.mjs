// Local SMTP fake for development and tests: accepts every message on loopback and keeps it
// as a raw .eml file, plus one JSON line per message in index.jsonl for quick lookups.
//
//   node docker-free-dev/mail-fake.mjs
//   env: ROUNDMARK_SMTP_PORT (2526), ROUNDMARK_MAIL_DIR (.data/mail under the repo root)
//
// File names start with the arrival time and a counter, so a plain sort is arrival order.
// Each .eml is written to a temporary name and renamed, and its index line is appended only
// after that, so a reader that finds a line in the index can always read the whole message.
import fs from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const host = '127.0.0.1';
const port = Number(process.env.ROUNDMARK_SMTP_PORT || 2526);
const mailDir = process.env.ROUNDMARK_MAIL_DIR
  ? path.resolve(process.env.ROUNDMARK_MAIL_DIR)
  : path.join(repoRoot, '.data', 'mail');
const indexFile = path.join(mailDir, 'index.jsonl');
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

let counter = 0;

/** 20260101T120000123Z-000001.eml: arrival time to the millisecond, then a counter. */
function nextFileName(arrived) {
  counter += 1;
  const stamp = arrived.toISOString().replace(/[-:]/g, '').replace('.', '');
  return `${stamp}-${String(counter).padStart(6, '0')}.eml`;
}

async function storeMessage(raw, envelope) {
  const arrived = new Date();
  const file = nextFileName(arrived);
  const target = path.join(mailDir, file);
  await fs.writeFile(`${target}.tmp`, raw);
  await fs.rename(`${target}.tmp`, target);

  let subject = null;
  try {
    subject = (await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true })).subject ?? null;
  } catch {
    // A message that does not parse is still kept as it came; only its subject is unknown.
  }
  const entry = {
    file,
    from: envelope.mailFrom ? envelope.mailFrom.address : '',
    to: envelope.rcptTo.map((r) => r.address),
    subject,
    date: arrived.toISOString(),
  };
  await fs.appendFile(indexFile, `${JSON.stringify(entry)}\n`);
  return file;
}

await fs.mkdir(mailDir, { recursive: true });

const server = new SMTPServer({
  name: 'roundmark-mail-fake',
  banner: 'Roundmark local mail fake: messages are stored, never delivered',
  secure: false,
  disabledCommands: ['STARTTLS'],
  authOptional: true,
  // Production SMTP_URLs may carry credentials; the fake accepts any so the same code runs here.
  allowInsecureAuth: true,
  onAuth(auth, _session, callback) {
    callback(null, { user: auth.username || 'local' });
  },
  size: MAX_MESSAGE_BYTES,
  logger: false,
  onData(stream, session, callback) {
    const chunks = [];
    stream.on('data', (chunk) => chunks.push(chunk));
    stream.on('error', callback);
    stream.on('end', () => {
      if (stream.sizeExceeded) {
        const err = new Error(`Message is larger than ${MAX_MESSAGE_BYTES} bytes`);
        err.responseCode = 552;
        callback(err);
        return;
      }
      storeMessage(Buffer.concat(chunks), session.envelope).then(
        (file) => callback(null, `stored as ${file}`),
        (err) => {
          console.error(`mail fake: could not store a message: ${err.message}`);
          const failure = new Error('Could not store the message');
          failure.responseCode = 451;
          callback(failure);
        },
      );
    });
  },
});

let listening = false;
server.on('error', (err) => {
  if (listening) {
    // Errors on single connections (a client that hangs up) are not fatal for the fake.
    if (err.code !== 'ECONNRESET') console.error(`mail fake: ${err.message}`);
    return;
  }
  if (err.code === 'EADDRINUSE') {
    console.error(
      `mail fake: port ${port} on ${host} is already in use ` +
        '(another mail fake running? set ROUNDMARK_SMTP_PORT to use another port)',
    );
  } else {
    console.error(`mail fake: could not listen on ${host}:${port}: ${err.message}`);
  }
  process.exit(1);
});

server.listen(port, host, () => {
  listening = true;
  const rel = path.relative(repoRoot, mailDir);
  console.log(`mail fake     smtp://${host}:${port}  mail ${rel.startsWith('..') ? mailDir : rel}`);
});

let stopping = false;
function stop(signal) {
  if (stopping) process.exit(1);
  stopping = true;
  // smtp-server waits for open sessions to end, then calls back (it forces them after 30 s).
  server.close(() => {
    console.log(`mail fake stopped (${signal})`);
    process.exit(0);
  });
  setTimeout(() => process.exit(0), 3000).unref();
}
process.on('SIGTERM', () => stop('SIGTERM'));
process.on('SIGINT', () => stop('SIGINT'));
