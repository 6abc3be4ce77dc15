import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

const mailDir = () => {
  const dir = process.env.OXBLOOM_MAIL_DIR;
  if (!dir) throw new Error('OXBLOOM_MAIL_DIR is not set: run the suite with `npm test`.');
  return dir;
};

/** Every captured message, oldest first, with its recipients exactly as written. */
async function capturedMail(): Promise<CapturedMail[]> {
  let files: string[] = [];
  try {
    files = readdirSync(mailDir())
      .filter((name) => name.endsWith('.eml'))
      .sort();
  } catch {
    return [];
  }
  const found: CapturedMail[] = [];
  for (const file of files) {
    const mail = await simpleParser(readFileSync(path.join(mailDir(), file)));
    const to = [mail.to]
      .flat()
      .flatMap((address) => address?.value ?? [])
      .map((value) => value.address ?? '');
    found.push({ file, to, subject: mail.subject ?? '', mail });
  }
  return found;
}

/** Every captured message to `to`, oldest first (decoded: subjects, quoted-printable bodies). */
export async function mailTo(to: string): Promise<ParsedMail[]> {
  const wanted = to.toLowerCase();
  return (await capturedMail()).filter((captured) => captured.to.some((address) => address.toLowerCase() === wanted)).map((captured) => captured.mail);
}

/** Waits for the next message to `to` whose subject contains `subject`, beyond the `already` seen. */
export async function waitForMail(to: string, subject: string, already = 0, timeoutMs = 10_000): Promise<ParsedMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const matching = (await mailTo(to)).filter((mail) => mail.subject?.includes(subject));
    if (matching.length > already) return matching[matching.length - 1];
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`No mail to ${to} with subject containing “${subject}” within ${timeoutMs} ms`);
}

export async function countMail(to: string, subject: string): Promise<number> {
  return (await mailTo(to)).filter((mail) => mail.subject?.includes(subject)).length;
}

/** The first link in the message's text that starts with `prefix` (an absolute URL). */
export function linkIn(mail: ParsedMail, prefix: string): string {
  const text = `${mail.text ?? ''} ${typeof mail.html === 'string' ? mail.html : ''}`;
  const escaped = prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const match = new RegExp(`${escaped}[^\\s"<>]*`).exec(text);
  if (!match) throw new Error(`No link starting ${prefix} in “${mail.subject}”`);
  return match[0].replace(/&amp;/g, '&');
}

export interface CapturedMail {
  file: string;
  /** Recipients exactly as the message names them (not lower-cased). */
  to: string[];
  subject: string;
  mail: ParsedMail;
}

/** Every captured message with a recipient whose address contains `fragment`, oldest first. */
export async function mailMentioning(fragment: string): Promise<CapturedMail[]> {
  return (await capturedMail()).filter((captured) => captured.to.some((address) => address.includes(fragment)));
}

/** Every link in a message's text and HTML that starts with `prefix`. */
export function linksIn(mail: ParsedMail, prefix: string): string[] {
  const text = `${mail.text ?? ''} ${typeof mail.html === 'string' ? mail.html : ''}`;
  const escaped = prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return [...new Set([...text.matchAll(new RegExp(`${escaped}[^\\s"<>]*`, 'g'))].map((match) => match[0].replace(/&amp;/g, '&')))];
}
