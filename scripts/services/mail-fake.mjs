// @ts-check
// The local SMTP fake: accepts every message on loopback, keeps each as an .eml file in
// MAIL_FAKE_DIR, and shows them on a small inbox page (MAIL_FAKE_INBOX_PORT) on loopback. Each SMTP
// session is logged when it closes to MAIL_FAKE_DIR/sessions.log, as "<time> mail" or, for a
// session that sent nothing (a connection check), "<time> probe".
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { appendFileSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';

const smtpPort = Number(process.env.MAIL_FAKE_SMTP_PORT ?? 2525);
const inboxPort = Number(process.env.MAIL_FAKE_INBOX_PORT ?? 4580);
const directory = process.env.MAIL_FAKE_DIR ?? path.resolve('.data/dev/mail');
mkdirSync(directory, { recursive: true });
const sessionLog = path.join(directory, 'sessions.log');
writeFileSync(sessionLog, '', { flag: 'a' });
const sentMail = new Set();

let sequence = 0;
const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  banner: 'Oxbloom local mail fake',
  onMailFrom(_address, session, callback) {
    sentMail.add(session.id);
    callback();
  },
  onClose(session) {
    appendFileSync(sessionLog, `${Date.now()} ${sentMail.delete(session.id) ? 'mail' : 'probe'}\n`);
  },
  onData(stream, _session, callback) {
    /** @type {Buffer[]} */
    const chunks = [];
    stream.on('data', (chunk) => chunks.push(chunk));
    stream.on('end', () => {
      sequence += 1;
      const name = `${Date.now()}-${String(sequence).padStart(4, '0')}.eml`;
      writeFileSync(path.join(directory, name), Buffer.concat(chunks));
      callback();
    });
  },
});
smtp.on('error', (error) => console.error('mail fake:', error.message));
smtp.listen(smtpPort, '127.0.0.1');

/** @param {unknown} text */
const escape = (text) =>
  String(text ?? '').replace(/[&<>"]/g, (c) => /** @type {Record<string, string>} */ ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]);

async function inboxPage() {
  const files = readdirSync(directory)
    .filter((name) => name.endsWith('.eml'))
    .sort()
    .reverse()
    .slice(0, 100);
  const rows = [];
  for (const file of files) {
    const mail = await simpleParser(readFileSync(path.join(directory, file)));
    rows.push(
      `<li><a href="/messages/${escape(file)}">${escape(mail.subject)}</a> to ${escape(/** @type {{ text?: string } | undefined} */ (mail.to)?.text)} · ${escape(mail.date?.toISOString())}</li>`,
    );
  }
  return `<!doctype html><meta charset="utf-8"><title>Oxbloom local inbox</title><h1>Captured mail (${files.length})</h1><ul>${rows.join('')}</ul>`;
}

/** @param {string} file */
async function messagePage(file) {
  const mail = await simpleParser(readFileSync(path.join(directory, file)));
  const body = mail.html || `<pre>${escape(mail.text)}</pre>`;
  return `<!doctype html><meta charset="utf-8"><title>${escape(mail.subject)}</title><p><a href="/">Inbox</a></p><h1>${escape(mail.subject)}</h1><p>To ${escape(/** @type {{ text?: string } | undefined} */ (mail.to)?.text)}</p>${body}`;
}

const inbox = http.createServer(async (request, response) => {
  try {
    const match = /^\/messages\/([\w.-]+\.eml)$/.exec(request.url ?? '');
    const html = match ? await messagePage(match[1]) : await inboxPage();
    response.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(html);
  } catch {
    response.writeHead(404, { 'content-type': 'text/plain' }).end('No such message');
  }
});
inbox.listen(inboxPort, '127.0.0.1');

console.log(`mail fake: SMTP 127.0.0.1:${smtpPort}, inbox http://127.0.0.1:${inboxPort}, files in ${directory}`);
const stop = () => {
  smtp.close(() => process.exit(0));
  inbox.close();
  setTimeout(() => process.exit(0), 2000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
